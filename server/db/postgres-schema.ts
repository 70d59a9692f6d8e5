import { QueryTypes, type QueryInterface } from 'sequelize'
import type { AllowedValuesTrigger, SchemaDialect, SetOnceTrigger } from './dialect.ts'
import { quoteName } from './quote.ts'

// PostgreSQL runs a trigger as a function. Each kind of rule is one function, shared by every table and given its
// table's details as trigger arguments (TG_ARGV), so dropping a table (which drops its triggers) leaves nothing behind
// that names it; CREATE OR REPLACE makes each migration that needs a function safe to run again.
const text = (value: string) => `'${value.replaceAll("'", "''")}'`
const fn = (name: string, body: string) =>
  `CREATE OR REPLACE FUNCTION ${name}() RETURNS trigger LANGUAGE plpgsql AS $fn$
  BEGIN
    ${body}
  END
  $fn$`

// TG_ARGV[0]: the message.
const REFUSE = fn('plumbline_refuse', `RAISE EXCEPTION '%', TG_ARGV[0] USING ERRCODE = 'restrict_violation';`)

// TG_ARGV[0]: the column set once, [1]: the message, [2…]: the columns that must stay as they were.
const SET_ONCE = fn(
  'plumbline_set_once',
  `IF NOT (to_jsonb(OLD) -> TG_ARGV[0] = 'null'::jsonb AND to_jsonb(NEW) -> TG_ARGV[0] <> 'null'::jsonb) THEN
      RAISE EXCEPTION '%', TG_ARGV[1] USING ERRCODE = 'restrict_violation';
    END IF;
    FOR i IN 2 .. TG_NARGS - 1 LOOP
      IF to_jsonb(OLD) -> TG_ARGV[i] IS DISTINCT FROM to_jsonb(NEW) -> TG_ARGV[i] THEN
        RAISE EXCEPTION '%', TG_ARGV[1] USING ERRCODE = 'restrict_violation';
      END IF;
    END LOOP;
    RETURN NEW;`,
)

// TG_ARGV[0]: the column, [1]: the message, [2…]: the values allowed. A null passes, as SQLite's NOT IN lets it.
const ALLOWED_VALUES = fn(
  'plumbline_allowed_values',
  `IF to_jsonb(NEW) ->> TG_ARGV[0] IS NOT NULL AND NOT (to_jsonb(NEW) ->> TG_ARGV[0] = ANY (TG_ARGV[2:TG_NARGS - 1])) THEN
      RAISE EXCEPTION '%', TG_ARGV[1] USING ERRCODE = 'check_violation';
    END IF;
    RETURN NEW;`,
)

// The sync cursor (see "The sync cursor on PostgreSQL" in DEVELOPERS.md): the UPDATE of the one counter row takes its
// row lock, held until the writing transaction ends. A second writer waits there and, at READ COMMITTED, reads the
// counter as the first one committed it: numbers are handed out in commit order, and a reader that has seen a number
// never later sees a smaller one appear.
const SYNC_SEQ = fn(
  'plumbline_sync_seq',
  `UPDATE sync_counter SET value = value + 1 WHERE id = 1 RETURNING value INTO NEW."syncSeq";
    RETURN NEW;`,
)

// Before a statement touches a row of `exams` (an UPDATE locks its rows before row triggers run), it takes the counter's
// row lock: a writer holding an exam row never waits for the counter while the counter's holder waits for that row.
const SYNC_LOCK = fn(
  'plumbline_sync_lock',
  `PERFORM 1 FROM sync_counter WHERE id = 1 FOR UPDATE;
    RETURN NULL;`,
)

const trigger = (name: string, when: string, table: string, fnName: string, args: readonly string[]) =>
  `CREATE TRIGGER ${quoteName(name)} ${when} ON ${quoteName(table)} FOR EACH ROW EXECUTE FUNCTION ${fnName}(${args.map(text).join(', ')})`

const SYNC_TRIGGERS = [
  ['exams_sync_seq_insert', 'BEFORE INSERT'],
  ['exams_sync_seq_update', 'BEFORE UPDATE'],
] as const
const SYNC_LOCKS = [
  ['exams_sync_lock_insert', 'BEFORE INSERT'],
  ['exams_sync_lock_update', 'BEFORE UPDATE'],
] as const
const statementTrigger = (name: string, when: string) =>
  `CREATE TRIGGER ${quoteName(name)} ${when} ON "exams" FOR EACH STATEMENT EXECUTE FUNCTION plumbline_sync_lock()`

function setOnceTrigger({ name, table, column, unchanged, message }: SetOnceTrigger): string[] {
  return [SET_ONCE, trigger(name, 'BEFORE UPDATE', table, 'plumbline_set_once', [column, message, ...unchanged])]
}

function allowedValuesTrigger({ name, table, column, values, message }: AllowedValuesTrigger): string[] {
  return [ALLOWED_VALUES, trigger(name, 'BEFORE INSERT', table, 'plumbline_allowed_values', [column, message, ...values])]
}

/** ALTER TABLE … DROP COLUMN keeps the table's rows, other indexes and triggers; foreign keys on the column go with it. */
async function dropColumn(q: QueryInterface, table: string, column: string): Promise<void> {
  await q.sequelize.query(`ALTER TABLE ${quoteName(table)} DROP COLUMN ${quoteName(column)}`)
}

/** Renames the table, its primary key's index and the sequence of its serial column, so the old names can be made again. */
async function renameTable(q: QueryInterface, from: string, to: string): Promise<void> {
  const serials = (await q.sequelize.query(
    `SELECT a.attname AS "column", pg_get_serial_sequence(:table, a.attname) AS "sequence"
     FROM pg_attribute a WHERE a.attrelid = CAST(:table AS regclass) AND a.attnum > 0 AND NOT a.attisdropped`,
    { replacements: { table: quoteName(from) }, type: QueryTypes.SELECT },
  )) as { column: string; sequence: string | null }[]
  await q.renameTable(from, to)
  await q.sequelize.query(`ALTER INDEX IF EXISTS ${quoteName(`${from}_pkey`)} RENAME TO ${quoteName(`${to}_pkey`)}`)
  for (const { column, sequence } of serials) {
    if (sequence) await q.sequelize.query(`ALTER SEQUENCE ${sequence} RENAME TO ${quoteName(`${to}_${column}_seq`)}`)
  }
}

/** setval of the column's sequence to the highest id stored (or 1, not yet called, for an empty table). */
async function continueIds(q: QueryInterface, table: string, column: string): Promise<void> {
  const name = quoteName(column)
  await q.sequelize.query(
    `SELECT setval(pg_get_serial_sequence(:table, :column), COALESCE(MAX(${name}), 1), MAX(${name}) IS NOT NULL) FROM ${quoteName(table)}`,
    { replacements: { table: quoteName(table), column } },
  )
}

export const postgresSchema: SchemaDialect = {
  noUpdateTrigger: (table, message) => [REFUSE, trigger(`${table}_no_update`, 'BEFORE UPDATE', table, 'plumbline_refuse', [message])],
  noDeleteTrigger: (table, message) => [REFUSE, trigger(`${table}_no_delete`, 'BEFORE DELETE', table, 'plumbline_refuse', [message])],
  setOnceTrigger,
  allowedValuesTrigger,
  syncCursorTriggers: () => [
    SYNC_LOCK,
    SYNC_SEQ,
    ...SYNC_LOCKS.map(([name, when]) => statementTrigger(name, when)),
    ...SYNC_TRIGGERS.map(([name, when]) => trigger(name, when, 'exams', 'plumbline_sync_seq', [])),
  ],
  dropSyncCursorTriggers: () =>
    [...SYNC_LOCKS, ...SYNC_TRIGGERS].map(([name]) => `DROP TRIGGER IF EXISTS ${quoteName(name)} ON "exams"`).reverse(),
  dropTrigger: (table, name) => [`DROP TRIGGER ${quoteName(name)} ON ${quoteName(table)}`],
  dropColumn,
  renameTable,
  continueIds,
}
