// The server in its own process on a fresh demo data folder, over loopback: (1) the concurrency test's mixed load —
// 50 writers (new exams, sync pushes of 20, PATCHes of one base version) and 50 readers of the exam log at once —
// in several rounds; (2) 30 sign-ins at once at the real bcrypt cost while one reader polls the exam log.
// Prints latencies and status counts beside the goals; asserts nothing. Run: npm run bench:load
import { spawn } from 'node:child_process'
import { mkdtempSync, rmSync } from 'node:fs'
import { availableParallelism, loadavg, tmpdir } from 'node:os'
import path from 'node:path'
import { SessionSchema } from '#shared/schemas/user'
import { recordExam } from '../server/factories/exam.ts'
import { mixedLoad, type LoadKind, type Outcome } from '../server/concurrency/mixed-load.ts'

const ROUNDS = 5
const SIGN_INS = 30
const MIXED_P99_GOAL_MS = 2_000
const READER_GOAL_MS = 300
const DEMO_PASSWORD = 'bedside-demo'
// Ten demo accounts, three sign-ins each: the limiter counts a sign-in in flight against its e-mail (10 per 15 min).
const DEMO_EMAILS = [
  'admin',
  'educator',
  'attending',
  'attending2',
  'resident',
  'resident2',
  'resident3',
  'resident4',
  'resident5',
  'resident6',
]

/** The server as `npm start` runs it (bcrypt cost 13), on a free port and a fresh data folder with the demo data. */
function startServer(dataDir: string) {
  const { BCRYPT_COST: _lowered, ...inherited } = process.env
  const env = {
    ...inherited,
    PORT: '0',
    DATA_DIR: dataDir,
    DEMO: 'true',
    LOG_LEVEL: 'warn',
    COOKIE_SECURE: 'false',
    NODE_ENV: 'production',
  }
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], { env, stdio: ['ignore', 'pipe', 'inherit'] })
  const url = new Promise<string>((resolve, reject) => {
    child.stdout.on('data', (chunk: Buffer) => {
      const match = /running at (\S+)/.exec(chunk.toString())
      if (match) resolve(match[1]!)
    })
    child.once('exit', (code) => reject(new Error(`server exited with ${code}`)))
  })
  return { child, url }
}

async function signIn(url: string, email: string) {
  const started = performance.now()
  const response = await fetch(`${url}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: `${email}@saltmarsh.test`, password: DEMO_PASSWORD }),
  })
  const ms = performance.now() - started
  return { status: response.status, ms, body: response.ok ? SessionSchema.parse(await response.json()) : undefined }
}

/** Nearest-rank percentile. */
function percentile(values: number[], p: number): number {
  const sorted = [...values].sort((a, b) => a - b)
  return sorted[Math.max(0, Math.ceil((p / 100) * sorted.length) - 1)] ?? NaN
}

const ms = (v: number) => `${v.toFixed(0)} ms`
const spread = (values: number[]) =>
  `p50 ${ms(percentile(values, 50))}, p95 ${ms(percentile(values, 95))}, p99 ${ms(percentile(values, 99))}`

function statusCounts(statuses: number[]): string {
  const counts = new Map<number, number>()
  for (const s of statuses) counts.set(s, (counts.get(s) ?? 0) + 1)
  return [...counts]
    .sort(([a], [b]) => a - b)
    .map(([s, n]) => `${s}×${n}`)
    .join(' ')
}

async function mixedRounds(url: string, auth: string, teamId: string): Promise<Outcome[]> {
  const outcomes: Outcome[] = []
  for (let round = 0; round < ROUNDS; round++) {
    const base = await recordExam(url, auth, { teamId })
    outcomes.push(...(await mixedLoad({ url, auth, teamId, base }, 50, 50)))
  }
  return outcomes
}

function printMixed(outcomes: Outcome[]) {
  console.log(`Mixed load: ${ROUNDS} rounds of 50 writers + 50 readers at once (${outcomes.length} requests)`)
  for (const kind of ['create', 'push', 'patch', 'read'] satisfies LoadKind[]) {
    const of = outcomes.filter((o) => o.kind === kind)
    console.log(`  ${kind.padEnd(6)} ${spread(of.map((o) => o.ms))}; ${statusCounts(of.map((o) => o.status))}`)
  }
  const all = outcomes.map((o) => o.ms)
  console.log(`  all    ${spread(all)} (goal: p99 ≤ ${ms(MIXED_P99_GOAL_MS)}); 5xx: ${outcomes.filter((o) => o.status >= 500).length}`)
}

/** GET /api/exams one after another until `until` settles; answers each one's latency. */
async function pollLog(url: string, auth: string, until: Promise<unknown>): Promise<number[]> {
  let done = false
  void until.finally(() => (done = true))
  const latencies: number[] = []
  while (!done) {
    const started = performance.now()
    const response = await fetch(`${url}/api/exams`, { headers: { authorization: auth } })
    await response.arrayBuffer()
    latencies.push(performance.now() - started)
  }
  return latencies
}

async function signInBurst(url: string, auth: string) {
  const idle = await pollLog(url, auth, new Promise((resolve) => setTimeout(resolve, 2_000)))
  const burst = Promise.all(Array.from({ length: SIGN_INS }, (_, i) => signIn(url, DEMO_EMAILS[i % DEMO_EMAILS.length]!)))
  const during = await pollLog(url, auth, burst)
  const signIns = await burst
  console.log(`Sign-in burst: ${SIGN_INS} sign-ins at once (bcrypt cost 13) while one reader polls GET /api/exams`)
  console.log(`  sign-ins         ${spread(signIns.map((s) => s.ms))}; ${statusCounts(signIns.map((s) => s.status))}`)
  console.log(`  reader, idle     ${spread(idle)} (${idle.length} reads)`)
  console.log(
    `  reader, burst    p50 ${ms(percentile(during, 50))}, p99 ${ms(percentile(during, 99))} (goal ≤ ${ms(READER_GOAL_MS)}; ${during.length} reads)`,
  )
}

// Other work on the machine stretches every figure; the load average says how much there was.
const machineLoad = () => `load average ${loadavg()[0]!.toFixed(1)} on ${availableParallelism()} cores`

const dataDir = mkdtempSync(path.join(tmpdir(), 'plumbline-bench-load-'))
const server = startServer(dataDir)
try {
  const url = await server.url
  const resident = await signIn(url, 'resident')
  if (!resident.body) throw new Error(`sign-in answered ${resident.status}`)
  const auth = `Bearer ${resident.body.token}`
  console.log(`Machine: ${machineLoad()}`)
  printMixed(await mixedRounds(url, auth, resident.body.user.teams[0]!.id))
  await signInBurst(url, auth)
  console.log(`Machine: ${machineLoad()}`)
} finally {
  server.child.kill('SIGTERM')
  await new Promise((resolve) => server.child.once('exit', resolve))
  rmSync(dataDir, { recursive: true, force: true })
}
