import { existsSync } from 'node:fs'
import path from 'node:path'
import { loadConfig } from '../config.ts'
import { openDatabase } from '../db/sequelize.ts'
import { describeReport } from './chain-report.ts'
import { verifyAuditChain } from './chain-verify.ts'

// `npm run audit:verify`: exit code 0 when the chain is intact, 1 when it is broken, 2 when it could not be checked.
const file = path.join(loadConfig().DATA_DIR, 'plumbline.sqlite')
if (!existsSync(file)) {
  console.error(`No database at ${file}`)
  process.exit(2)
}
const sequelize = openDatabase(file)
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
