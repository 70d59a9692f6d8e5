import { availableParallelism } from 'node:os'
import bcrypt from 'bcryptjs'
import { Piscina } from 'piscina'
import { bcryptCost } from '../config.ts'

/** OWASP ASVS 4.0.3 2.4.4: a work factor of at least 10; 13 is a product default (`BCRYPT_COST` may raise it; only the test runner may lower it). */
export const BCRYPT_COST = bcryptCost()

// A hash at cost 13 is about 0.8 s of CPU in bcryptjs: on the main thread a burst of sign-ins would stall every other
// request behind it. The pool runs them on as many threads as there are cores, and on none while nobody signs in.
const WORKER = new URL('./password-worker.js', import.meta.url)
const IDLE_THREAD_MS = 60_000
let pool: Piscina | undefined

function hashingPool(): Piscina {
  pool ??= new Piscina({ filename: WORKER.href, minThreads: 0, maxThreads: availableParallelism(), idleTimeout: IDLE_THREAD_MS })
  return pool
}

export function hashPassword(password: string): Promise<string> {
  return hashingPool().run({ password, cost: BCRYPT_COST }, { name: 'hash' })
}

export async function verifyPassword(password: string, hash: string | null): Promise<boolean> {
  // Compare against a dummy hash of the same cost when there is none, so unknown accounts take as long as known ones.
  return hashingPool().run({ password, hash: hash ?? (await dummyHash()) }, { name: 'verify' })
}

/** A hash made with a lower work factor than today's, to be replaced at the next successful sign-in. */
export function needsRehash(hash: string): boolean {
  return bcrypt.getRounds(hash) < BCRYPT_COST
}

/** Stops the hashing threads (graceful shutdown); a later hash starts the pool again. */
export async function closePasswordHashing(): Promise<void> {
  const closing = pool
  pool = undefined
  await closing?.destroy()
}

const COST_13_DUMMY_HASH = '$2b$13$4Vr2Mui07XfRkdCL3J4pneSotfztWUsMwcBkebEpkRsATHc3PH0Di'
let dummy: Promise<string> | undefined

function dummyHash(): Promise<string> {
  if (BCRYPT_COST === 13) return Promise.resolve(COST_13_DUMMY_HASH)
  // Made once, at the configured cost; forgotten if the pool closed under it, so the next caller makes it again.
  dummy ??= hashPassword('no account has this password').catch((err: unknown) => {
    dummy = undefined
    throw err
  })
  return dummy
}
