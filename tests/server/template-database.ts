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
  await sequelize.close()
  project.provide('templateDatabase', file)
  return () => rmSync(dir, { recursive: true, force: true })
}
