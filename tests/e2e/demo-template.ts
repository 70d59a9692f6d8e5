import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import type { TestProject } from 'vitest/node'

declare module 'vitest' {
  export interface ProvidedContext {
    /** A SQLite file with every migration applied and the demo hospital seeded, copied into each browser test's server. */
    demoDatabase: string
  }
}

/** Vitest global setup: migrates and seeds the demo once per run; on a file database that takes seconds. */
export default async function setup(project: TestProject) {
  // The same work factor as the servers the tests start, so signing in with the seeded hash stays cheap.
  Object.assign(process.env, { NODE_ENV: 'test', ...project.config.env })
  const { openDatabase } = await import('../../server/db/sequelize.ts')
  const { createMigrator } = await import('../../server/db/migrator.ts')
  const { initModels } = await import('../../server/models/index.ts')
  const { seedDemo } = await import('../../server/demo/seed.ts')
  const dir = mkdtempSync(path.join(tmpdir(), 'plumbline-demo-template-'))
  const file = path.join(dir, 'plumbline.sqlite')
  const sequelize = openDatabase(file)
  initModels(sequelize)
  await createMigrator(sequelize).up()
  await seedDemo()
  await sequelize.close()
  project.provide('demoDatabase', file)
  return () => rmSync(dir, { recursive: true, force: true })
}
