// Throughput of the paged reads over many exams against bare Express serving the same page from memory, each server
// in its own process, autocannon in this one. Run: npm run bench:api [-- --exams=1000000] [-- --data-dir=/tmp/bench-1m]
// With DATABASE_URL set, the exams are seeded into (or reused from) that PostgreSQL database, and the server reads it.
import { fork, spawn, type ChildProcess } from 'node:child_process'
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import autocannon from 'autocannon'
import { signAccessToken } from '../../server/auth/tokens.ts'
import { createMigrator } from '../../server/db/migrator.ts'
import { databaseLocation, openDatabase } from '../../server/db/sequelize.ts'
import { cursorAfter } from '../../server/exams/exam-keyset.ts'
import { ExamModel, initModels, UserModel } from '../../server/models/index.ts'
import { seedBench } from './api-seed.ts'

const flag = (name: string) => process.argv.find((a) => a.startsWith(`--${name}=`))?.slice(name.length + 3)
const EXAMS = Number(flag('exams') ?? 100_000)
/** A folder to seed once and keep (`--data-dir=…`): a later run with the same folder and count skips the seeding. */
const KEPT_DIR = flag('data-dir')
/** `--source-maps=off`: the server without source-mapped stack traces (tsx turns them on), to measure what they cost. */
const SOURCE_MAPS = flag('source-maps') !== 'off'
const SECRET = 'bench-secret-'.padEnd(64, 'x')
const CONNECTIONS = 50
const DURATION_S = 10
const WARM_UP_S = 3
const ACCEPT = { 'accept-encoding': 'br, gzip' }
// The demo's seed hashes ten passwords: the test work factor spares the bench a few seconds (server/config.ts).
Object.assign(process.env, { NODE_ENV: 'test', BCRYPT_COST: '5' })

interface Target {
  name: string
  path: string
  token?: string
  goal: { ratio?: number; p99Ms: number }
}

/** The server as `npm run dev:server` runs it, on the seeded folder; resolves with its URL. */
function startServer(dataDir: string): { child: ChildProcess; url: Promise<string> } {
  const env = { ...process.env, PORT: '0', DATA_DIR: dataDir, DEMO: 'false', LOG_LEVEL: 'warn', JWT_SECRET: SECRET }
  Object.assign(env, { NODE_ENV: 'production', BCRYPT_COST: '13', PUBLIC_URL: 'https://plumbline.test' })
  const imports = ['--import', 'tsx', ...(SOURCE_MAPS ? [] : ['--import', './tests/bench/no-source-maps.ts'])]
  const child = spawn(process.execPath, [...imports, 'server/index.ts'], { env, stdio: ['ignore', 'pipe', 'inherit'] })
  const url = new Promise<string>((resolve, reject) => {
    child.stdout!.on('data', (chunk: Buffer) => {
      const match = /running at (\S+)/.exec(chunk.toString())
      if (match) resolve(match[1]!)
    })
    child.once('exit', (code) => reject(new Error(`server exited with ${code}`)))
  })
  return { child, url }
}

function startBare(file: string): Promise<{ child: ChildProcess; port: number }> {
  const child = fork('tests/bench/bare-express.ts', [file], { execArgv: ['--import', 'tsx'] })
  return new Promise((resolve) => child.once('message', (port) => resolve({ child, port: Number(port) })))
}

const stopped = (child: ChildProcess) =>
  new Promise<void>((resolve) => (child.exitCode !== null ? resolve() : child.once('exit', () => resolve()).kill('SIGTERM')))

const HEAVY = 'resident@saltmarsh.test'
const ATTENDING = 'attending@saltmarsh.test'

/**
 * Seeds the database (the SQLite file in the data folder, or DATABASE_URL's) unless it already holds this many exams;
 * answers the tokens and a cursor deep in the resident's log.
 */
async function seed(dataDir: string) {
  const sequelize = openDatabase(databaseLocation({ DATABASE_URL: process.env.DATABASE_URL, DATA_DIR: dataDir }))
  initModels(sequelize)
  await createMigrator(sequelize).up()
  const started = performance.now()
  if ((await ExamModel.count()) < EXAMS) await seedBench(sequelize, EXAMS)
  console.log(`Seeded the demo and ${EXAMS.toLocaleString('en')} exams in ${((performance.now() - started) / 1000).toFixed(1)} s`)
  const [heavy, attending] = await Promise.all([HEAVY, ATTENDING].map((email) => UserModel.findOne({ where: { email } })))
  const depth = Math.floor(EXAMS * 0.45)
  const order = { sort: 'examinedAt', order: 'desc' } as const
  const deep = await ExamModel.findOne({
    where: { examinerId: heavy!.id },
    order: [
      ['examinedAt', 'DESC'],
      ['id', 'DESC'],
    ],
    offset: depth,
  })
  await sequelize.close()
  return {
    resident: signAccessToken(SECRET, { sub: heavy!.id, roles: ['resident'] }),
    attending: signAccessToken(SECRET, { sub: attending!.id, roles: ['attending'] }),
    deepCursor: cursorAfter(deep!, order, 10_000, true),
    depth,
  }
}

/**
 * A few requests and a short discarded burst first: the server's start-up work (the local error term over every pair),
 * the JIT and SQLite's cache stay out of the figures, which are then the steady state.
 */
async function warmUp(url: string, token?: string) {
  for (let i = 0; i < 5; i++) await encodingOf(url, token)
  await autocannon({
    url,
    connections: 10,
    duration: WARM_UP_S,
    headers: { ...ACCEPT, ...(token ? { authorization: `Bearer ${token}` } : {}) },
  })
}

/** One request's time to the whole answer: the first of a URL is built afresh (no cached answer has its key yet). */
async function timed(url: string, token?: string): Promise<number> {
  const started = performance.now()
  await encodingOf(url, token)
  return performance.now() - started
}

async function load(url: string, token?: string) {
  const coldMs = await timed(url, token)
  await warmUp(url, token)
  const result = await autocannon({
    url,
    connections: CONNECTIONS,
    duration: DURATION_S,
    headers: { ...ACCEPT, ...(token ? { authorization: `Bearer ${token}` } : {}) },
  })
  const failed = result.non2xx + result.errors + result.timeouts
  const answered = result.requests.total > failed
  return {
    rps: result.requests.average,
    p99: answered ? result.latency.p99 : Infinity,
    failed: failed ? `  ${failed} failed (non-2xx, errors, timeouts)` : '',
    coldMs,
  }
}

async function encodingOf(url: string, token?: string): Promise<string> {
  const res = await fetch(url, { headers: { ...ACCEPT, ...(token ? { authorization: `Bearer ${token}` } : {}) } })
  const bytes = (await res.arrayBuffer()).byteLength
  return `${res.headers.get('content-encoding') ?? 'none'} (${(bytes / 1024).toFixed(0)} KB JSON)`
}

const pad = (text: string, n: number) => text.padEnd(n)
const mark = (ok: boolean) => (ok ? 'PASS' : 'FAIL')

const dataDir = KEPT_DIR ?? mkdtempSync(path.join(tmpdir(), 'plumbline-bench-api-'))
mkdirSync(dataDir, { recursive: true })
const children: ChildProcess[] = []
try {
  const { resident, attending, deepCursor, depth } = await seed(dataDir)
  const server = startServer(dataDir)
  children.push(server.child)
  const url = (await server.url).replace('//localhost:', '//127.0.0.1:')
  const firstUrl = `${url}/api/exams?pageSize=50`
  const first = await fetch(firstUrl, { headers: { authorization: `Bearer ${resident}` } })
  const pageFile = path.join(dataDir, 'page.json')
  writeFileSync(pageFile, await first.text())
  const bare = await startBare(pageFile)
  children.push(bare.child)
  const bareUrl = `http://127.0.0.1:${bare.port}/page`
  const targets: Target[] = [
    { name: 'exam log, first page', path: '/api/exams?pageSize=50', token: resident, goal: { ratio: 0.4, p99Ms: 100 } },
    {
      name: `exam log, after exam ${depth.toLocaleString('en')}`,
      path: `/api/exams?pageSize=50&page=901&cursor=${deepCursor}`,
      token: resident,
      goal: { p99Ms: 100 },
    },
    { name: 'sign-off queue, first page', path: '/api/signoff-queue?pageSize=50', token: attending, goal: { p99Ms: 100 } },
    { name: 'sync pull from 0 (500)', path: '/api/sync/pull?cursor=0&limit=500', token: resident, goal: { p99Ms: 150 } },
  ]
  const baseline = await load(bareUrl)
  const database = process.env.DATABASE_URL ? 'PostgreSQL' : 'SQLite'
  console.log(
    `\n${EXAMS.toLocaleString('en')} exams on ${database}, source maps ${SOURCE_MAPS ? 'on' : 'off'}, ${CONNECTIONS} connections, ${DURATION_S} s each, Accept-Encoding: br, gzip`,
  )
  console.log(
    `${pad('bare Express, first page from memory', 40)} ${baseline.rps.toFixed(0).padStart(6)} req/s  p99 ${String(baseline.p99).padStart(5)} ms  ${await encodingOf(bareUrl)}`,
  )
  for (const target of targets) {
    const result = await load(`${url}${target.path}`, target.token)
    const ratio = result.rps / baseline.rps
    const goals = [`p99 ≤ ${target.goal.p99Ms} ms ${mark(result.p99 <= target.goal.p99Ms)}`]
    if (target.goal.ratio) goals.unshift(`≥ ${target.goal.ratio} of bare ${mark(ratio >= target.goal.ratio)}`)
    const line = `${pad(target.name, 40)} ${result.rps.toFixed(0).padStart(6)} req/s  p99 ${String(result.p99).padStart(5)} ms  ratio ${ratio.toFixed(2)}  first (built afresh) ${result.coldMs.toFixed(0)} ms`
    console.log(`${line}  ${await encodingOf(`${url}${target.path}`, target.token)}  goal: ${goals.join(', ')}${result.failed}`)
  }
} finally {
  await Promise.all(children.map(stopped))
  if (!KEPT_DIR) rmSync(dataDir, { recursive: true, force: true })
}
