import { DataTypes, QueryTypes, type QueryInterface } from 'sequelize'
import { GENESIS_HASH, linkRows } from '../../audit-trail/audit-chain.ts'
import { continueIds, dropColumn, renameTable } from '../columns.ts'
import { appendOnlyTriggers } from '../triggers.ts'

// The columns of audit_events as 2026.12.02T06.00.00.foundation made them.
const EVENT_COLUMNS = {
  id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
  at: { type: DataTypes.DATE, allowNull: false },
  actorId: { type: DataTypes.STRING(36), allowNull: true },
  action: { type: DataTypes.STRING(60), allowNull: false },
  entityType: { type: DataTypes.STRING(40), allowNull: true },
  entityId: { type: DataTypes.STRING(64), allowNull: true },
  changes: { type: DataTypes.TEXT, allowNull: true },
}
// Nullable: a row written around the server (raw SQL) has none, and the verifier names it.
const CHAIN_COLUMNS = {
  seq: { type: DataTypes.INTEGER, allowNull: true },
  prevHash: { type: DataTypes.STRING(64), allowNull: true },
  hash: { type: DataTypes.STRING(64), allowNull: true },
}
const names = (prefix = '') =>
  Object.keys(EVENT_COLUMNS)
    .map((c) => `${prefix}"${c}"`)
    .join(', ')
const SEQ_INDEX = 'audit_events_seq'

type StoredEvent = {
  id: number
  at: string
  actorId: string | null
  action: string
  entityType: string | null
  entityId: string | null
  changes: string | null
}

/** Every row's chain columns, in the order the rows were written (their ids), from the genesis value. */
async function chainOfExisting(q: QueryInterface) {
  const rows = await q.sequelize.query<StoredEvent>(`SELECT ${names()} FROM "audit_events" ORDER BY "id"`, { type: QueryTypes.SELECT })
  return linkRows(rows, { seq: 0, hash: GENESIS_HASH }).map(({ id, seq, prevHash, hash }) => ({ id, seq, prevHash, hash }))
}

/**
 * The append-only triggers refuse the UPDATE a back-fill would need, so the rows move to a new table with the chain
 * columns: the old values are copied by SQL as stored, the chain is joined on by id, and the indexes and triggers come
 * back. No transaction: the trigger helpers run on the migration's own connection.
 */
export async function up(q: QueryInterface): Promise<void> {
  const chain = await chainOfExisting(q)
  await q.createTable('audit_chain_backfill', { id: { type: DataTypes.INTEGER, primaryKey: true }, ...CHAIN_COLUMNS })
  for (let i = 0; i < chain.length; i += 500) await q.bulkInsert('audit_chain_backfill', chain.slice(i, i + 500))
  await renameTable(q, 'audit_events', 'audit_events_unchained')
  await q.createTable('audit_events', { ...EVENT_COLUMNS, ...CHAIN_COLUMNS })
  await q.sequelize.query(
    `INSERT INTO "audit_events" (${names()}, "seq", "prevHash", "hash")
     SELECT ${names('e.')}, c."seq", c."prevHash", c."hash"
     FROM "audit_events_unchained" e LEFT JOIN "audit_chain_backfill" c ON c."id" = e."id"`,
  )
  await continueIds(q, 'audit_events', 'id')
  await q.dropTable('audit_events_unchained')
  await q.dropTable('audit_chain_backfill')
  await q.addIndex('audit_events', ['entityType', 'entityId'])
  await q.addIndex('audit_events', ['at'])
  await q.addIndex('audit_events', ['seq'], { name: SEQ_INDEX, unique: true })
  // 21 CFR 11.10(e), as before: the trail stays append-only, enforced by the database itself.
  await appendOnlyTriggers(q, 'audit_events', 'audit trail is append-only')
}

export async function down(q: QueryInterface): Promise<void> {
  await q.removeIndex('audit_events', SEQ_INDEX)
  for (const column of ['hash', 'prevHash', 'seq']) await dropColumn(q, 'audit_events', column)
}
