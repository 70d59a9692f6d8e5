import bcrypt from 'bcryptjs'
import { bcryptCost } from '../config.ts'

/** OWASP ASVS 4.0.3 2.4.4: a work factor of at least 10; 13 is a product default (`BCRYPT_COST` may raise it; only the test runner may lower it). */
export const BCRYPT_COST = bcryptCost()

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, BCRYPT_COST)
}

export function verifyPassword(password: string, hash: string | null): Promise<boolean> {
  // Compare against a dummy hash of the same cost when there is none, so unknown accounts take as long as known ones.
  return bcrypt.compare(password, hash ?? DUMMY_HASH)
}

/** A hash made with a lower work factor than today's, to be replaced at the next successful sign-in. */
export function needsRehash(hash: string): boolean {
  return bcrypt.getRounds(hash) < BCRYPT_COST
}

const COST_13_DUMMY_HASH = '$2b$13$4Vr2Mui07XfRkdCL3J4pneSotfztWUsMwcBkebEpkRsATHc3PH0Di'
const DUMMY_HASH = BCRYPT_COST === 13 ? COST_13_DUMMY_HASH : bcrypt.hashSync('no account has this password', BCRYPT_COST)
