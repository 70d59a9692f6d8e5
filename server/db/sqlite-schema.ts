import { QueryTypes, type QueryInterface } from 'sequelize'
import type { AllowedValuesTrigger, SchemaDialect, SetOnceTrigger } from './dialect.ts'
import { quoteName } from './quote.ts'
import { rebuildTable, withoutColumn } from './sqlite-rebuild.ts'

// Identifiers in the CREATE TRIGGER texts stay unquoted: SQLite keeps each text verbatim in sqlite_master, and a
// database migrated before these helpers existed must keep the same schema, byte for byte.
const text = (value: string) => `'${value.replaceAll("'", "''")}'`
const refuse = (message: string) => `SELECT RAISE(ABORT, ${text(message)});`

// One counter row, bumped inside the writing statement: SQLite serialises writers, so the numbers follow commit order
// and a reader never sees a later number before an earlier one. Recursive triggers are off, so the inner UPDATE does not
// fire the update trigger again.
const bump = `
  UPDATE sync_counter SET value = value + 1 WHERE id = 1;
  UPDATE exams SET syncSeq = (SELECT value FROM sync_counter WHERE id = 1) WHERE rowid = NEW.rowid;`

function setOnceTrigger({ name, table, column, unchanged, message }: SetOnceTrigger): string[] {
  const same = unchanged.map((c) => `NEW.${c} IS OLD.${c}`).join(' AND ')
  return [
    `CREATE TRIGGER ${name} BEFORE UPDATE ON ${table}
     WHEN NOT (OLD.${column} IS NULL AND NEW.${column} IS NOT NULL AND ${same})
     BEGIN ${refuse(message)} END`,
  ]
}

function allowedValuesTrigger({ name, table, column, values, message }: AllowedValuesTrigger): string[] {
  return [
    `CREATE TRIGGER ${name} BEFORE INSERT ON ${table} WHEN NEW.${column} NOT IN (${values.map(text).join(', ')})
     BEGIN ${refuse(message)} END`,
  ]
}

/** ALTER TABLE … DROP COLUMN where SQLite allows it; a column under a foreign key needs the table rebuilt. */
async function dropColumn(q: QueryInterface, table: string, column: string): Promise<void> {
  const keys = await q.sequelize.query<{ from: string }>(`PRAGMA foreign_key_list(${quoteName(table)})`, { type: QueryTypes.SELECT })
  if (keys.some((k) => k.from === column)) await rebuildTable(q, table, (sql) => withoutColumn(sql, column))
  else await q.sequelize.query(`ALTER TABLE ${quoteName(table)} DROP COLUMN ${quoteName(column)}`)
}

export const sqliteSchema: SchemaDialect = {
  noUpdateTrigger: (table, message) => [`CREATE TRIGGER ${table}_no_update BEFORE UPDATE ON ${table} BEGIN ${refuse(message)} END`],
  noDeleteTrigger: (table, message) => [`CREATE TRIGGER ${table}_no_delete BEFORE DELETE ON ${table} BEGIN ${refuse(message)} END`],
  setOnceTrigger,
  allowedValuesTrigger,
  syncCursorTriggers: () => [
    `CREATE TRIGGER exams_sync_seq_insert AFTER INSERT ON exams BEGIN ${bump} END`,
    `CREATE TRIGGER exams_sync_seq_update AFTER UPDATE ON exams BEGIN ${bump} END`,
  ],
  dropSyncCursorTriggers: () =>
    ['exams_sync_seq_update', 'exams_sync_seq_insert'].map((name) => `DROP TRIGGER IF EXISTS ${quoteName(name)}`),
  dropTrigger: (_table, name) => [`DROP TRIGGER ${quoteName(name)}`],
  dropColumn,
  renameTable: (q, from, to) => q.renameTable(from, to),
  // AUTOINCREMENT keeps the highest id inserted in sqlite_sequence, explicit ones included.
  continueIds: async () => {},
}
