// Times the accuracy summary over 100,000 measured pressures in a temporary SQLite file. Run: npm run bench:agreement
import { randomUUID } from 'node:crypto'
import { mkdtempSync, rmSync } from 'node:fs'
import type { AddressInfo } from 'node:net'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { pino } from 'pino'
import type { Transaction } from 'sequelize'
import { computeEstimate } from '#shared/domain/estimate'
import { ExamInputSchema, type ExamInput } from '#shared/schemas/exam'
import type { ReferenceKind } from '#shared/schemas/reference'
import { createApp } from '../../server/app.ts'
import { signAccessToken } from '../../server/auth/tokens.ts'
import { createMigrator } from '../../server/db/migrator.ts'
import { openDatabase } from '../../server/db/sequelize.ts'
import { seededRandom } from '../../server/demo/demo-pairs.ts'
import { columnsOf } from '../../server/exams/exam-record.ts'
import { ExamModel, initModels, MembershipModel, ReferenceModel, TeamModel, UserModel } from '../../server/models/index.ts'

const REFERENCES = 100_000
const RUNS = 7
const TARGET_MS = 500
const CHUNK = 2_000
const SECRET = 'bench-secret-'.padEnd(64, 'x')
const KINDS: ReferenceKind[] = ['central-line', 'central-line', 'catheter-ra', 'echo-ra']
const random = seededRandom(11)

async function makeStaff() {
  const teams = await Promise.all([0, 1, 2].map((i) => TeamModel.create({ id: randomUUID(), name: `Team ${i}` })))
  const person = (role: 'resident' | 'educator', i: number) =>
    UserModel.create({ id: randomUUID(), email: `${role}${i}@bench.test`, displayName: `${role} ${i}`, passwordHash: null, roles: [role] })
  const residents = []
  for (let i = 0; i < 30; i++) {
    const resident = await person('resident', i)
    await MembershipModel.create({ userId: resident.id, teamId: teams[i % 3]!.id })
    residents.push(resident)
  }
  return { teams, residents, educator: await person('educator', 0) }
}

// One estimate per height and inclination, as the exams would store them (the whole estimate JSON, prompts included).
const estimates = new Map<string, ReturnType<typeof computeEstimate>>()
function estimateOf(input: ExamInput) {
  const key = `${input.heightCm}/${input.inclinationDeg}`
  if (!estimates.has(key)) estimates.set(key, computeEstimate(input))
  return estimates.get(key)!
}

/** Each reference on its own exam, 5–55 minutes after it; the estimate and the measured value about 4 cmH₂O apart. */
async function insertReferences(staff: Awaited<ReturnType<typeof makeStaff>>, transaction: Transaction): Promise<void> {
  const start = Date.UTC(2026, 0, 1)
  const base = ExamInputSchema.parse({
    ...{ id: randomUUID(), patientCode: 'AC-0', teamId: staff.teams[0]!.id, examinedAt: new Date(start).toISOString() },
    ...{ inclinationDeg: 45, vein: 'right-internal', columnTop: 'seen', heightCm: 4 },
  })
  for (let from = 0; from < REFERENCES; from += CHUNK) {
    const exams = [],
      references = []
    for (let k = from; k < from + CHUNK; k++) {
      const at = start + k * 5 * 60_000
      const input: ExamInput = {
        ...base,
        id: randomUUID(),
        patientCode: `AC-${k}`,
        teamId: staff.teams[k % 3]!.id,
        examinedAt: new Date(at).toISOString(),
        inclinationDeg: 30 + (k % 31),
        heightCm: Math.round(random() * 20 - 4) / 2,
      }
      const estimate = estimateOf(input)
      exams.push({
        id: input.id,
        examinerId: staff.residents[k % 30]!.id,
        status: 'submitted',
        version: 2,
        submittedAt: new Date(at),
        ...columnsOf(input, estimate),
      })
      const kind = KINDS[k % KINDS.length]!
      const valueCmH2O = estimate.cvpCmH2O! + (random() - 0.5) * 8
      const reference = { id: randomUUID(), examId: input.id, kind, value: valueCmH2O, unit: 'cmH2O', valueCmH2O }
      references.push({
        ...reference,
        measuredAt: new Date(at + (5 + (k % 51)) * 60_000),
        addedById: staff.residents[k % 30]!.id,
        addedAt: new Date(at),
      })
    }
    await ExamModel.bulkCreate(exams, { transaction })
    await ReferenceModel.bulkCreate(references, { transaction })
  }
}

const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!
const ms = (value: number) => `${value.toFixed(0)} ms`.padStart(7)

interface Timing {
  wall: number
  /** CPU time of this process (server and client), which a busy machine inflates less than wall time. */
  cpu: number
}

async function timeGet(url: string, auth: string, expectedN: (n: number) => boolean): Promise<Timing> {
  const [started, cpu] = [performance.now(), process.cpuUsage()]
  const res = await fetch(url, { headers: { authorization: auth } })
  const body = (await res.json()) as { coverage?: { n: number } }
  const used = process.cpuUsage(cpu)
  if (res.status !== 200 || !expectedN(body.coverage?.n ?? -1))
    throw new Error(`Unexpected answer ${res.status}: ${JSON.stringify(body).slice(0, 200)}`)
  return { wall: performance.now() - started, cpu: (used.user + used.system) / 1000 }
}

async function report(label: string, url: string, auth: string, expectedN: (n: number) => boolean): Promise<number> {
  const timings: Timing[] = []
  for (let i = 0; i < RUNS; i++) timings.push(await timeGet(url, auth, expectedN))
  const wall = timings.map((t) => t.wall)
  console.log(
    `${label.padEnd(44)} median ${ms(median(wall))}, max ${ms(Math.max(...wall))}   (CPU median ${ms(median(timings.map((t) => t.cpu)))})`,
  )
  return median(wall)
}

const dir = mkdtempSync(path.join(tmpdir(), 'plumbline-bench-accuracy-'))
const sequelize = openDatabase(path.join(dir, 'bench.sqlite'))
try {
  const models = initModels(sequelize)
  await createMigrator(sequelize).up()
  const staff = await makeStaff()
  const seeding = performance.now()
  await sequelize.transaction((transaction) => insertReferences(staff, transaction))
  console.log(`Inserted ${REFERENCES} exams with a measured pressure each in ${((performance.now() - seeding) / 1000).toFixed(1)} s`)
  const app = createApp({
    sequelize,
    models,
    secret: SECRET,
    log: pino({ level: 'silent' }),
    demo: false,
    cookieSecure: false,
    baseUrl: 'https://plumbline.test',
  })
  const server = app.listen(0, '127.0.0.1')
  await new Promise((resolve) => server.once('listening', resolve))
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/agreement/accuracy`
  const auth = `Bearer ${signAccessToken(SECRET, { sub: staff.educator.id, roles: ['educator'] })}`
  const all = await report(`GET /api/agreement/accuracy (${REFERENCES} pairs)`, url, auth, (n) => n === REFERENCES)
  const kind = await report('  ?kind=central-line (half of them)', `${url}?kind=central-line`, auth, (n) => n === REFERENCES / 2)
  const team = await report(
    '  ?teamId=<one of three teams>',
    `${url}?teamId=${staff.teams[0]!.id}`,
    auth,
    (n) => Math.abs(n - REFERENCES / 3) < 2,
  )
  const worst = Math.max(all, kind, team)
  console.log(`Target ≤ ${TARGET_MS} ms: ${worst <= TARGET_MS ? 'met' : 'NOT met'} (slowest median ${ms(worst).trim()})`)
  await new Promise((resolve) => server.close(resolve))
} finally {
  await sequelize.close()
  rmSync(dir, { recursive: true, force: true })
}
