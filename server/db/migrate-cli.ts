import { mkdirSync } from 'node:fs'
import path from 'node:path'
import { loadConfig } from '../config.ts'
import { createMigrator } from './migrator.ts'
import { openDatabase } from './sequelize.ts'

const config = loadConfig()
mkdirSync(config.DATA_DIR, { recursive: true })
const sequelize = openDatabase(path.join(config.DATA_DIR, 'plumbline.sqlite'))
const done = await createMigrator(sequelize).up()
console.log(`Applied ${done.length} migration(s)`)
await sequelize.close()
