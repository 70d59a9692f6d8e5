import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import type { TestProject } from 'vitest/node'
import { createMigrator } from '../../server/db/migrator.ts'
import { openDatabase } from '../../server/db/sequelize.ts'

/** Vitest global setup: runs the migrations once per test run instead of once per test. */
export default async function setup(project: TestProject) {
  const dir = mkdtempSync(path.join(tmpdir(), 'plumbline-template-'))
  const file = path.join(dir, 'template.sqlite')
  const sequelize = openDatabase(file)
  await createMigrator(sequelize).up()
  // The server opens its file in WAL mode; the template goes back to a plain rollback journal, which the workers copying
  // it at once only share-lock. In WAL mode the last reader to close checkpoints under an exclusive lock, and a worker
  // opening the file at that moment got "database is locked".
  await sequelize.query('PRAGMA journal_mode = DELETE')
  await sequelize.close()
  project.provide('templateDatabase', file)
  return () => rmSync(dir, { recursive: true, force: true })
}
