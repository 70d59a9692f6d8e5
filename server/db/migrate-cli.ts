import { mkdirSync } from 'node:fs'
import { loadConfig } from '../config.ts'
import { createMigrator } from './migrator.ts'
import { databaseFile, openDatabase } from './sequelize.ts'

const config = loadConfig()
mkdirSync(config.DATA_DIR, { recursive: true })
const sequelize = openDatabase(databaseFile(config.DATA_DIR))
const done = await createMigrator(sequelize).up()
console.log(`Applied ${done.length} migration(s)`)
await sequelize.close()
