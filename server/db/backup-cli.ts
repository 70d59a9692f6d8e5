import { mkdirSync } from 'node:fs'
import path from 'node:path'
import { loadConfig } from '../config.ts'
import { backupDatabase } from './sqlite-backup.ts'
import { fileStamp } from './sqlite-file.ts'
import { databaseFile } from './sequelize.ts'

// `npm run backup [-- FILE]`: a consistent copy of DATA_DIR's database, also while the server runs.
const config = loadConfig()
if (config.DATABASE_URL) {
  console.error(
    "npm run backup works on the SQLite file in DATA_DIR; DATABASE_URL names a PostgreSQL database: use PostgreSQL's own tools (pg_dump -Fc, and pg_restore)",
  )
  process.exit(2)
}
const target = path.resolve(process.argv[2] ?? path.join(config.DATA_DIR, 'backups', `plumbline-${fileStamp()}.sqlite`))
mkdirSync(path.dirname(target), { recursive: true })
try {
  const { migration } = await backupDatabase(databaseFile(config.DATA_DIR), target)
  console.log(`Backed up the database to ${target} (migration ${migration})`)
} catch (err) {
  console.error(`Backup failed: ${(err as Error).message}`)
  process.exitCode = 1
}
