import type { QueryInterface } from 'sequelize'
import { schemaDialect, type AllowedValuesTrigger, type SetOnceTrigger } from './dialect.ts'

// Every trigger of the schema is made here, each database in its own words (dialect.ts): a migration never writes
// CREATE TRIGGER itself. Dropping a table drops its triggers with it.

async function run(q: QueryInterface, statements: string[]): Promise<void> {
  for (const sql of statements) await q.sequelize.query(sql)
}

/** Rows are only ever added: `<table>_no_update` and `<table>_no_delete` refuse every change with `message`. */
export async function appendOnlyTriggers(q: QueryInterface, table: string, message: string): Promise<void> {
  const dialect = schemaDialect(q)
  await run(q, [...dialect.noUpdateTrigger(table, message), ...dialect.noDeleteTrigger(table, message)])
}

/** `<table>_no_delete`: rows are never removed (updates are left to another trigger). */
export async function noDeleteTrigger(q: QueryInterface, table: string, message: string): Promise<void> {
  await run(q, schemaDialect(q).noDeleteTrigger(table, message))
}

/** An UPDATE may only set `column` once, from null, leaving every other column as it was. */
export async function setOnceTrigger(q: QueryInterface, spec: SetOnceTrigger): Promise<void> {
  await run(q, schemaDialect(q).setOnceTrigger(spec))
}

/** An INSERT must put one of `values` in `column`. */
export async function allowedValuesTrigger(q: QueryInterface, spec: AllowedValuesTrigger): Promise<void> {
  await run(q, schemaDialect(q).allowedValuesTrigger(spec))
}

/** Every insert into and update of `exams` takes the next number of `sync_counter` as its `syncSeq` (the sync cursor). */
export async function syncCursorTriggers(q: QueryInterface): Promise<void> {
  await run(q, schemaDialect(q).syncCursorTriggers())
}

/** Drops the trigger `name` of `table`, e.g. to make it again over more columns. */
export async function dropTrigger(q: QueryInterface, table: string, name: string): Promise<void> {
  await run(q, schemaDialect(q).dropTrigger(table, name))
}

export async function dropSyncCursorTriggers(q: QueryInterface): Promise<void> {
  await run(q, schemaDialect(q).dropSyncCursorTriggers())
}
