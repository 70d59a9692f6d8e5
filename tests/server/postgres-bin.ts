import { execFileSync } from 'node:child_process'
import { existsSync, readdirSync } from 'node:fs'
import path from 'node:path'

/** Where Debian (package postgresql) puts the server's programs, newest version first; `PG_BIN` names another folder. */
export function postgresBin(): string | undefined {
  if (process.env.PG_BIN) return existsSync(path.join(process.env.PG_BIN, 'initdb')) ? process.env.PG_BIN : undefined
  const root = '/usr/lib/postgresql'
  const versions = existsSync(root) ? readdirSync(root).sort((a, b) => Number(b) - Number(a)) : []
  return versions.map((v) => path.join(root, v, 'bin')).find((bin) => existsSync(path.join(bin, 'initdb')))
}

/**
 * Why the server-pg project cannot start its cluster on this machine, or null when it can: the programs are missing,
 * or, as root (PostgreSQL refuses to run as root), the account the cluster would belong to does not exist.
 */
export function postgresUnavailable(): string | null {
  if (!postgresBin()) return 'PostgreSQL is not installed (no initdb under /usr/lib/postgresql/*/bin or PG_BIN)'
  if (process.getuid?.() !== 0) return null
  const owner = process.env.PG_TEST_USER ?? 'postgres'
  try {
    execFileSync('id', ['-u', owner], { stdio: 'ignore' })
    return null
  } catch {
    return `running as root and there is no account "${owner}" to own the throwaway cluster (PostgreSQL refuses root; set PG_TEST_USER)`
  }
}
