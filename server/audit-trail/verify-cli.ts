import { existsSync } from 'node:fs'
import { loadConfig } from '../config.ts'
import { databaseLocation, isPostgresUrl, openDatabase } from '../db/sequelize.ts'
import { describeReport } from './chain-report.ts'
import { verifyAuditChain } from './chain-verify.ts'

// `npm run audit:verify`: the chain on DATABASE_URL when set, else in the SQLite file in DATA_DIR, as `npm run migrate`
// chooses. Exit code 0 when the chain is intact, 1 when it is broken, 2 when it could not be checked.
const location = databaseLocation(loadConfig())
// Opening a missing SQLite file would create an empty one.
if (!isPostgresUrl(location) && !existsSync(location)) {
  console.error(`No database at ${location}`)
  process.exit(2)
}
const sequelize = openDatabase(location)
try {
  const report = await verifyAuditChain(sequelize)
  console.log(describeReport(report))
  process.exitCode = report.ok ? 0 : 1
} catch (err) {
  console.error(`Could not read the audit chain (has \`npm run migrate\` run?): ${(err as Error).message}`)
  process.exitCode = 2
} finally {
  await sequelize.close()
}
