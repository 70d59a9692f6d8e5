import { QueryTypes, type Sequelize } from 'sequelize'
import type { AuditChainBreak, AuditChainReport } from '#shared/schemas/audit'
import { AuditEventModel } from '../models/index.ts'
import { chainHash, GENESIS_HASH, type ChainedContent } from './audit-chain.ts'

interface StoredRow extends ChainedContent {
  id: number
  prevHash: string | null
  hash: string | null
}

const PAGE = 1_000
const COLUMNS = `"id", "seq", "at", "actorId", "action", "entityType", "entityId", "changes", "prevHash", "hash"`

/** ISO 8601 when the stored time parses, else the stored text as it is. */
function text(at: unknown): string {
  const time = new Date(at as string)
  return Number.isNaN(time.getTime()) ? String(at) : time.toISOString()
}

/** What is wrong between `prev` (the last good row) and `row`, the next one in sequence order; null when they link. */
export function checkLink(prev: { seq: number; hash: string }, row: StoredRow): AuditChainBreak | null {
  const at = text(row.at)
  if (row.seq !== prev.seq + 1) {
    const gap = row.seq - 1 > prev.seq + 1 ? `Rows ${prev.seq + 1} to ${row.seq - 1} are` : `Row ${prev.seq + 1} is`
    return { kind: 'missing-row', seq: prev.seq + 1, at, message: `${gap} missing: the chain goes from row ${prev.seq} to row ${row.seq}` }
  }
  if (row.prevHash !== prev.hash)
    return {
      kind: 'bad-link',
      seq: row.seq,
      at,
      message: `Row ${row.seq} does not link to row ${prev.seq}: one of them was changed or replaced`,
    }
  if (row.hash !== chainHash(row.prevHash, row))
    return {
      kind: 'changed-row',
      seq: row.seq,
      at,
      message: `Row ${row.seq} was changed after it was written: its content no longer gives its hash`,
    }
  return null
}

function page(db: Sequelize, after: number): Promise<StoredRow[]> {
  const sql = `SELECT ${COLUMNS} FROM "audit_events" WHERE "seq" > :after ORDER BY "seq" LIMIT ${PAGE}`
  return db.query<StoredRow>(sql, { type: QueryTypes.SELECT, replacements: { after } })
}

async function unchainedRow(db: Sequelize): Promise<AuditChainBreak | null> {
  const sql = `SELECT "id", "at" FROM "audit_events" WHERE "seq" IS NULL OR "hash" IS NULL ORDER BY "id" LIMIT 1`
  const [row] = await db.query<{ id: number; at: unknown }>(sql, { type: QueryTypes.SELECT })
  if (!row) return null
  return {
    kind: 'unchained-row',
    seq: null,
    at: text(row.at),
    message: `Row id ${row.id} has no place in the chain: it was written around the server`,
  }
}

/** Walks the audit chain from the genesis value in sequence order and names the first broken link. */
export async function verifyAuditChain(db: Sequelize = AuditEventModel.sequelize!): Promise<AuditChainReport> {
  let prev = { seq: 0, hash: GENESIS_HASH, at: '' }
  let checkedRows = 0
  let firstBreak: AuditChainBreak | null = null
  for (let rows = await page(db, 0); rows.length && !firstBreak; rows = await page(db, prev.seq)) {
    for (const row of rows) {
      firstBreak = checkLink(prev, row)
      if (firstBreak) break
      prev = { seq: row.seq, hash: row.hash!, at: text(row.at) }
      checkedRows += 1
    }
  }
  firstBreak ??= await unchainedRow(db)
  const head = prev.seq > 0 ? prev : null
  return { ok: !firstBreak, checkedRows, head, firstBreak, verifiedAt: new Date().toISOString() }
}
