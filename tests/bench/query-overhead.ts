// What Sequelize spends per query on SQLite with Node's source maps on (as tsx and `npm run serve` run the server) and
// off: its SQLite query reads `new Error().stack` on every query, formatting the stack (its PostgreSQL query only on an
// error). Alternating rounds, medians. Run: npx tsx tests/bench/query-overhead.ts (DATABASE_URL set: on PostgreSQL)
import { QueryTypes } from 'sequelize'
import { createMigrator } from '../../server/db/migrator.ts'
import { openDatabase } from '../../server/db/sequelize.ts'
import { initModels, UserModel } from '../../server/models/index.ts'

const N = 1_000
const ROUNDS = 8

async function microsPer(work: () => Promise<unknown>) {
  const started = performance.now()
  for (let i = 0; i < N; i++) await work()
  return ((performance.now() - started) * 1000) / N
}

const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!

const sequelize = openDatabase(process.env.DATABASE_URL ?? ':memory:')
initModels(sequelize)
await createMigrator(sequelize).up()
const stackOnly = async () => new Error().stack
const select = () => sequelize.query('SELECT 1 AS "x"', { type: QueryTypes.SELECT })
const findUser = () => UserModel.findOne({ attributes: ['id'], where: { id: 'none' } })
for (const [name, work] of [
  ['new Error().stack', stackOnly],
  ['SELECT 1', select],
  ['UserModel.findOne', findUser],
] as const) {
  const times = { on: [] as number[], off: [] as number[] }
  await microsPer(work)
  for (let round = 0; round < ROUNDS; round++)
    for (const maps of ['on', 'off'] as const) {
      process.setSourceMapsEnabled(maps === 'on')
      times[maps].push(await microsPer(work))
    }
  console.log(
    `${name.padEnd(20)} source maps on ${median(times.on).toFixed(1)} µs, off ${median(times.off).toFixed(1)} µs (median of ${ROUNDS})`,
  )
}
await sequelize.close()
