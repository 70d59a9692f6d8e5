import { createHash } from 'node:crypto'

// The chain's format: rows already written were hashed with it, so it never changes (a new format would need a
// migration that re-chains every row, and would lose the evidence it replaces).

/** The link before the first row: a fixed value, so a chain can be checked from its start. */
export const GENESIS_HASH = '0'.repeat(64)

/** The stored fields of one audit row that its hash covers, as written or as read back from the database. */
export interface ChainedContent {
  seq: number
  at: Date | string
  actorId: string | null
  action: string
  entityType: string | null
  entityId: string | null
  changes: string | null
}

/** ISO 8601 UTC whatever text the database keeps the time in; a time that no longer parses is kept as its text. */
function timeText(at: Date | string): string {
  const time = new Date(at)
  return Number.isNaN(time.getTime()) ? String(at) : time.toISOString()
}

/** One text per row content: a JSON array of the fields in a fixed order (`changes` as the stored JSON text). */
export function canonicalRow(row: ChainedContent): string {
  return JSON.stringify([row.seq, timeText(row.at), row.actorId, row.action, row.entityType, row.entityId, row.changes])
}

/** hash_n = SHA-256(hash_{n-1} ‖ canonical(row_n)), as lowercase hex; ‖ joins the previous hash's hex and the text. */
export function chainHash(prevHash: string, row: ChainedContent): string {
  return createHash('sha256')
    .update(prevHash + canonicalRow(row))
    .digest('hex')
}

export interface ChainLinks {
  seq: number
  prevHash: string
  hash: string
}

/** The chain columns of rows appended after `head`, in the rows' order. */
export function linkRows<T extends Omit<ChainedContent, 'seq'>>(rows: T[], head: { seq: number; hash: string }): (T & ChainLinks)[] {
  let { seq, hash } = head
  return rows.map((row) => {
    const prevHash = hash
    seq += 1
    hash = chainHash(prevHash, { ...row, seq })
    return { ...row, seq, prevHash, hash }
  })
}
