import { existsSync, readdirSync } from 'node:fs'
import path from 'node:path'

/** Where Debian (package postgresql) puts the server's programs, newest version first; `PG_BIN` names another folder. */
export function postgresBin(): string | undefined {
  if (process.env.PG_BIN) return existsSync(path.join(process.env.PG_BIN, 'initdb')) ? process.env.PG_BIN : undefined
  const root = '/usr/lib/postgresql'
  const versions = existsSync(root) ? readdirSync(root).sort((a, b) => Number(b) - Number(a)) : []
  return versions.map((v) => path.join(root, v, 'bin')).find((bin) => existsSync(path.join(bin, 'initdb')))
}
