import { execFile } from 'node:child_process'
import { createHash } from 'node:crypto'
import { promisify } from 'node:util'
import { QueryTypes } from 'sequelize'
import { afterEach, describe, expect, it } from 'vitest'
import { audit, auditAll } from '../../../server/audit.ts'
import { chainHash, GENESIS_HASH, type ChainedContent } from '../../../server/audit-trail/audit-chain.ts'
import { verifyAuditChain } from '../../../server/audit-trail/chain-verify.ts'
import { writeTransaction } from '../../../server/db/transaction.ts'
import { isPostgresUrl } from '../../../server/db/sequelize.ts'
import { isPostgres } from '../database-kind.ts'
import { dropTrigger, fileDatabase, rawSql } from './chain-database.ts'

const sha256 = (text: string) => createHash('sha256').update(text).digest('hex')
const canonicalFields = (r: Record<string, unknown>) => [
  r.seq,
  new Date(r.at as string).toISOString(),
  r.actorId,
  r.action,
  r.entityType,
  r.entityId,
  r.changes,
]

const cleanups: (() => Promise<void>)[] = []
afterEach(async () => {
  for (const cleanup of cleanups.splice(0)) await cleanup()
})

/** A database file holding five audited events, written the ways the server writes them. */
async function trailOfFive() {
  const db = await fileDatabase()
  cleanups.push(db.cleanup)
  await audit({ actorId: null, action: 'login-failed', entityType: 'user', changes: { reason: 'wrong-password' } })
  await audit({ actorId: 'user-1', action: 'login', entityType: 'user', entityId: 'user-1' })
  await writeTransaction(db.sequelize, (transaction) =>
    auditAll(
      [
        { actorId: 'user-1', action: 'exam-create', entityType: 'exam', entityId: 'exam-1' },
        { actorId: 'user-1', action: 'exam-submit', entityType: 'exam', entityId: 'exam-1' },
      ],
      { transaction },
    ),
  )
  await audit({ actorId: 'user-1', action: 'logout', entityType: 'user', entityId: 'user-1' })
  return db
}

describe('the audit hash chain', () => {
  it('links each row to the one before: hash = SHA-256(previous hash ‖ canonical row), from the genesis value', async () => {
    const { sequelize } = await trailOfFive()

    const rows = await sequelize.query<{ seq: number; prevHash: string; hash: string } & Record<string, unknown>>(
      'SELECT "seq", "at", "actorId", "action", "entityType", "entityId", "changes", "prevHash", "hash" FROM "audit_events" ORDER BY "seq"',
      { type: QueryTypes.SELECT },
    )

    expect(rows.map((r) => r.seq)).toEqual([1, 2, 3, 4, 5])
    expect(rows[0]!.prevHash).toBe(GENESIS_HASH)
    rows.slice(1).forEach((row, i) => expect(row.prevHash).toBe(rows[i]!.hash))
    // The definition, written out here: SHA-256 over the previous hex hash followed by the row as a JSON array.
    rows.forEach((row) => expect(row.hash).toBe(sha256(row.prevHash + JSON.stringify(canonicalFields(row)))))
  })

  it('an intact chain verifies, naming its last row', async () => {
    const { sequelize } = await trailOfFive()

    const report = await verifyAuditChain(sequelize)

    expect(report).toMatchObject({ ok: true, checkedRows: 5, firstBreak: null, head: { seq: 5 } })
  })

  it('a row deleted after dropping the trigger (raw SQL on the file) is reported as missing at its sequence number', async () => {
    const { sequelize, file } = await trailOfFive()

    await rawSql(file, `${dropTrigger('audit_events_no_delete')} DELETE FROM audit_events WHERE seq = 3;`)
    const report = await verifyAuditChain(sequelize)

    expect(report.ok).toBe(false)
    expect(report.firstBreak).toMatchObject({ kind: 'missing-row', seq: 3 })
    expect(report.firstBreak!.message).toContain('Row 3 is missing')
    expect(report.checkedRows).toBe(2)
  })

  it('a row edited after dropping the trigger is reported as changed at its sequence number and time', async () => {
    const { sequelize, file } = await trailOfFive()
    const [edited] = await sequelize.query<{ at: string }>('SELECT "at" FROM "audit_events" WHERE "seq" = 4', { type: QueryTypes.SELECT })

    await rawSql(file, `${dropTrigger('audit_events_no_update')} UPDATE audit_events SET "entityId" = 'exam-2' WHERE seq = 4;`)
    const report = await verifyAuditChain(sequelize)

    expect(report.firstBreak).toMatchObject({ kind: 'changed-row', seq: 4, at: new Date(edited!.at).toISOString() })
  })

  it('a row edited with its own hash recomputed is reported as a bad link at the row after it', async () => {
    const { sequelize, file } = await trailOfFive()
    const [row] = await sequelize.query<ChainedContent & { prevHash: string }>(
      'SELECT "seq", "at", "actorId", "action", "entityType", "entityId", "changes", "prevHash" FROM "audit_events" WHERE "seq" = 2',
      { type: QueryTypes.SELECT },
    )
    const forged = chainHash(row!.prevHash, { ...row!, actorId: 'user-2' })

    await rawSql(
      file,
      `${dropTrigger('audit_events_no_update')} UPDATE audit_events SET "actorId" = 'user-2', hash = '${forged}' WHERE seq = 2;`,
    )
    const report = await verifyAuditChain(sequelize)

    expect(report.firstBreak).toMatchObject({ kind: 'bad-link', seq: 3 })
    expect(report.checkedRows).toBe(2)
  })

  it('a row inserted around the server, without a place in the chain, is reported', async () => {
    const { sequelize, file } = await trailOfFive()

    await rawSql(file, `INSERT INTO audit_events (at, action) VALUES ('2026-12-01 08:00:00.000 +00:00', 'login')`)
    const report = await verifyAuditChain(sequelize)

    expect(report.firstBreak).toMatchObject({ kind: 'unchained-row', seq: null })
    expect(report.checkedRows).toBe(5)
  })
})

/** `npm run audit:verify` run as an operator would, on the database DATABASE_URL names, else the SQLite file in DATA_DIR. */
function verifyCli(dir: string, location: string) {
  const { DATABASE_URL: _unset, ...env } = process.env
  const database = isPostgresUrl(location) ? { DATABASE_URL: location } : {}
  return promisify(execFile)(process.execPath, ['--import', 'tsx', 'server/audit-trail/verify-cli.ts'], {
    env: { ...env, DATA_DIR: dir, ...database },
  }).then(
    ({ stdout }) => ({ code: 0, stdout }),
    (err: { code: number; stdout: string }) => ({ code: err.code, stdout: err.stdout }),
  )
}

describe(`npm run audit:verify (on ${isPostgres ? 'the database DATABASE_URL names' : 'the SQLite file in DATA_DIR'})`, () => {
  it('when the chain is intact, exits 0 and counts every row', async () => {
    const { dir, file } = await trailOfFive()

    const result = await verifyCli(dir, file)

    expect(result.code).toBe(0)
    expect(result.stdout).toContain('Audit chain intact: 5 row(s) verified.')
  })

  it('when a row is gone, exits 1 and names the first broken link', async () => {
    const { dir, file } = await trailOfFive()
    await rawSql(file, `${dropTrigger('audit_events_no_delete')} DELETE FROM audit_events WHERE seq = 2;`)

    const result = await verifyCli(dir, file)

    expect(result.code).toBe(1)
    expect(result.stdout).toContain('BROKEN (missing-row) at sequence 2')
  })
})
