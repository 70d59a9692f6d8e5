import { mkdirSync } from 'node:fs'
import { loadConfig } from '../config.ts'
import { createMigrator } from './migrator.ts'
import { databaseLocation, isPostgresUrl, openDatabase } from './sequelize.ts'

// `npm run migrate`: the pending migrations on DATABASE_URL when set, else on the SQLite file in DATA_DIR.
const config = loadConfig()
const location = databaseLocation(config)
if (!isPostgresUrl(location)) mkdirSync(config.DATA_DIR, { recursive: true })
const sequelize = openDatabase(location)
const done = await createMigrator(sequelize).up()
console.log(`Applied ${done.length} migration(s)`)
await sequelize.close()
