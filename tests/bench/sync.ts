// Pushes 2,000 exams from an outbox (fake-indexeddb in Node) to the real server in its own process, over loopback.
// Prints exams per second end to end and the server's peak RSS. Run: npm run bench:sync
// With DATABASE_URL set the server keeps its data there (PostgreSQL): name an empty database, which the server migrates
// and fills with the demo hospital as it starts; the 2,000 exams stay in it afterwards.
import { DEFAULT_ESTIMATE_SETTINGS } from '#shared/schemas/settings'
import { defaultObserverTerm } from '#shared/domain/estimate'
import 'fake-indexeddb/auto'
import { spawn } from 'node:child_process'
import { mkdtempSync, readFileSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { ExamInputSchema } from '#shared/schemas/exam'
import { SessionSchema } from '#shared/schemas/user'
import { configureApiBase } from '../../src/api/client.ts'
import { db } from '../../src/db/index.ts'
import { queueSave } from '../../src/db/outbox.ts'
import { newDraft } from '../../src/db/draft-schema.ts'
import { pullInto, pushOutbox } from '../../src/stores/sync-cycle.ts'

const EXAMS = 2_000
const TARGET_PER_SECOND = 500

/** The server as `npm start` runs it, on a free port and a fresh data folder; resolves with its URL. */
function startServer(dataDir: string) {
  const env = { ...process.env, PORT: '0', DATA_DIR: dataDir, DEMO: 'true', LOG_LEVEL: 'warn', COOKIE_SECURE: 'false' }
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

// Linux keeps a process's peak resident set as VmHWM.
function peakRssMb(pid: number): string {
  const line = readFileSync(`/proc/${pid}/status`, 'utf8')
    .split('\n')
    .find((l) => l.startsWith('VmHWM:'))
  return line ? `${(Number(line.replace(/\D/g, '')) / 1024).toFixed(0)} MB` : 'unknown'
}

async function signIn(url: string) {
  const response = await fetch(`${url}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: 'resident@saltmarsh.test', password: 'bedside-demo' }),
  })
  return SessionSchema.parse(await response.json())
}

// The bench measures sync throughput, not the band: every exam is estimated with the default settings and error term.
const BASIS = { settings: DEFAULT_ESTIMATE_SETTINGS, observer: defaultObserverTerm(DEFAULT_ESTIMATE_SETTINGS), settingsVersion: undefined }

async function fillOutbox(session: Awaited<ReturnType<typeof signIn>>) {
  const teamId = session.user.teams[0]!.id
  for (let i = 0; i < EXAMS; i++) {
    const draft = newDraft(session.user.teams, 'incline-adjusted')
    const input = ExamInputSchema.parse({
      ...draft.fields,
      id: draft.id,
      patientCode: `SM-${String(i).padStart(4, '0')}`,
      teamId,
      inclinationDeg: 30 + (i % 31),
      columnTop: 'seen',
      heightCm: (i % 12) - 2,
      notes: 'Recorded offline on the ward',
    })
    await queueSave(draft, input, session.user, BASIS)
  }
}

const dataDir = mkdtempSync(path.join(tmpdir(), 'plumbline-bench-sync-'))
const server = startServer(dataDir)
try {
  const url = await server.url
  configureApiBase(`${url}/api/`, { timeout: 60_000 })
  const session = await signIn(url)
  await fillOutbox(session)
  const account = { id: session.user.id, token: session.token, isCurrent: () => true }

  const started = performance.now()
  const failed = await pushOutbox(account)
  const seconds = (performance.now() - started) / 1000

  if (failed) throw new Error(`push failed: ${failed.message}`)
  const left = await db.outbox.count()
  const pullStarted = performance.now()
  await pullInto(account)
  const pulled = await db.exams.where('ownerId').equals(session.user.id).count()
  const perSecond = EXAMS / seconds
  console.log(
    `pushed ${EXAMS} exams in ${seconds.toFixed(2)} s: ${perSecond.toFixed(0)} exams/s (target ≥ ${TARGET_PER_SECOND}); ${left} left in the outbox`,
  )
  console.log(`pulled them back in ${((performance.now() - pullStarted) / 1000).toFixed(2)} s (${pulled} exams on the device)`)
  console.log(`server peak RSS: ${peakRssMb(server.child.pid!)}; database: ${process.env.DATABASE_URL ? 'PostgreSQL' : 'SQLite'}`)
  if (perSecond < TARGET_PER_SECOND || left > 0) process.exitCode = 1
} finally {
  server.child.kill('SIGTERM')
  await new Promise((resolve) => server.child.once('exit', resolve))
  rmSync(dataDir, { recursive: true, force: true })
}
