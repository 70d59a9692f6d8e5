import { QueryTypes } from 'sequelize'
import { openBlankDatabase } from '../helpers.ts'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import type { Sequelize } from 'sequelize'
import { verifyAuditChain } from '../../../server/audit-trail/chain-verify.ts'
import { createMigrator } from '../../../server/db/migrator.ts'

const BEFORE_CHAIN = '2026.12.10T09.30.00.agreement-pair-bounds'
let db: Sequelize
beforeEach(async () => {
  db = await openBlankDatabase()
})
afterEach(() => db.close())

/** Rows as the trail held them before the chain, written straight into that schema. */
async function unchainedTrail() {
  await createMigrator(db).up({ to: BEFORE_CHAIN })
  await db.getQueryInterface().bulkInsert('audit_events', [
    { at: new Date('2026-12-01T08:00:00Z'), actorId: 'user-1', action: 'login', entityType: 'user', entityId: 'user-1', changes: null },
    {
      at: new Date('2026-12-01T07:00:00Z'),
      actorId: 'user-1',
      action: 'exam-create',
      entityType: 'exam',
      entityId: 'exam-1',
      changes: '{"version":1}',
    },
    { at: new Date('2026-12-01T09:00:00Z'), actorId: null, action: 'login-failed', entityType: 'user', entityId: null, changes: null },
  ])
}

describe('migration 2026.12.11T10.00.00.audit-chain', () => {
  it('chains the rows already stored in the order they were written, and the chain verifies', async () => {
    await unchainedTrail()

    await createMigrator(db).up()

    const rows = await db.query<{ id: number; seq: number }>('SELECT "id", "seq" FROM "audit_events" ORDER BY "seq"', {
      type: QueryTypes.SELECT,
    })
    expect(rows.map((r) => [r.id, r.seq])).toEqual([
      [1, 1],
      [2, 2],
      [3, 3],
    ])
    expect(await verifyAuditChain(db)).toMatchObject({ ok: true, checkedRows: 3 })
  })

  it('keeps the trail append-only', async () => {
    await unchainedTrail()

    await createMigrator(db).up()

    const refused = { original: { message: expect.stringMatching(/append-only/) } }
    await expect(db.query(`UPDATE "audit_events" SET "action" = 'x'`)).rejects.toMatchObject(refused)
    await expect(db.query(`DELETE FROM "audit_events"`)).rejects.toMatchObject(refused)
  })
})
