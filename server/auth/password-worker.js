// The bcrypt work of server/auth/passwords.ts, run in piscina's worker threads. Plain JavaScript, so that Node loads it
// as it is from the sources (tsx, vitest) and from beside the bundle in dist/server, with no transform in between.
import bcrypt from 'bcryptjs'

/** @param {{ password: string, cost: number }} task */
export function hash({ password, cost }) {
  return bcrypt.hashSync(password, cost)
}

/** @param {{ password: string, hash: string }} task */
export function verify({ password, hash }) {
  return bcrypt.compareSync(password, hash)
}
