import { execFileSync } from 'node:child_process'
import { chownSync, mkdtempSync, rmSync } from 'node:fs'
import { createServer } from 'node:net'
import { tmpdir } from 'node:os'
import path from 'node:path'
import type { TestProject } from 'vitest/node'
import { createMigrator } from '../../server/db/migrator.ts'
import { openDatabase } from '../../server/db/sequelize.ts'
import { POSTGRES_TEMPLATE } from './database-kind.ts'
import { postgresBin } from './postgres-bin.ts'

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer().listen(0, '127.0.0.1', () => {
      const { port } = server.address() as { port: number }
      server.close(() => resolve(port))
    })
    server.once('error', reject)
  })
}

// PostgreSQL refuses to run as root: as root, the cluster belongs to the `postgres` account Debian's package creates.
const OWNER = process.env.PG_TEST_USER ?? 'postgres'
const asOwner = (program: string, args: string[]) =>
  process.getuid?.() === 0
    ? execFileSync('runuser', ['-u', OWNER, '--', program, ...args], { stdio: 'pipe' })
    : execFileSync(program, args, { stdio: 'pipe' })

// A throwaway cluster: nothing in it must survive a crash, so it skips every flush to disk.
const SETTINGS = ['fsync=off', 'synchronous_commit=off', 'full_page_writes=off', 'max_connections=400', "listen_addresses='127.0.0.1'"]

/**
 * Vitest global setup of the server-pg project: a PostgreSQL cluster in a temporary folder on a free port, and a
 * database migrated once as the template every test database is copied from (`CREATE DATABASE … TEMPLATE`).
 */
export default async function setup(project: TestProject) {
  const bin = postgresBin()
  if (!bin) throw new Error('PostgreSQL is not installed (no initdb under /usr/lib/postgresql/*/bin or PG_BIN)')
  const dir = mkdtempSync(path.join(tmpdir(), 'plumbline-pg-'))
  if (process.getuid?.() === 0)
    chownSync(dir, Number(execFileSync('id', ['-u', OWNER]).toString()), Number(execFileSync('id', ['-g', OWNER]).toString()))
  const data = path.join(dir, 'data')
  const port = await freePort()
  asOwner(path.join(bin, 'initdb'), ['-D', data, '-U', 'postgres', '-A', 'trust', '-E', 'UTF8', '--locale=C', '--no-sync'])
  const options = [`-p ${port}`, `-k ${dir}`, ...SETTINGS.map((s) => `-c ${s}`)].join(' ')
  asOwner(path.join(bin, 'pg_ctl'), ['-D', data, '-o', options, '-l', path.join(dir, 'server.log'), '-w', 'start'])
  const stop = () => {
    asOwner(path.join(bin, 'pg_ctl'), ['-D', data, '-m', 'immediate', 'stop'])
    rmSync(dir, { recursive: true, force: true })
  }
  try {
    const server = `postgres://postgres@127.0.0.1:${port}`
    const admin = openDatabase(`${server}/postgres`)
    await admin.query(`CREATE DATABASE ${POSTGRES_TEMPLATE}`)
    await admin.close()
    const template = openDatabase(`${server}/${POSTGRES_TEMPLATE}`)
    await createMigrator(template).up()
    await template.close()
    project.provide('postgresServer', server)
  } catch (err) {
    stop()
    throw err
  }
  return stop
}
