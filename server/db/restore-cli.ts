import path from 'node:path'
import { loadConfig } from '../config.ts'
import { restoreDatabase } from './sqlite-restore.ts'
import { databaseFile } from './sequelize.ts'

// `npm run restore -- FILE`: puts a backup in place of DATA_DIR's database; the server must be stopped.
const config = loadConfig()
if (config.DATABASE_URL) {
  console.error(
    "npm run restore works on the SQLite file in DATA_DIR; DATABASE_URL names a PostgreSQL database: use PostgreSQL's own tools (pg_restore of a pg_dump -Fc archive)",
  )
  process.exit(2)
}
const file = process.argv[2]
if (!file) {
  console.error('Usage: npm run restore -- FILE (a backup written by npm run backup)')
  process.exit(2)
}
try {
  const restored = await restoreDatabase(path.resolve(file), databaseFile(config.DATA_DIR), path.join(config.DATA_DIR, 'backups'))
  if (restored.replacedBy) console.log(`The database it replaced is kept at ${restored.replacedBy}`)
  console.log(`Restored ${file} (migration ${restored.migration}); newer migrations run when the server starts`)
} catch (err) {
  console.error(`Restore refused: ${(err as Error).message}`)
  process.exitCode = 1
}
