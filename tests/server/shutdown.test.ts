import { mkdtempSync, rmSync } from 'node:fs'
import { Agent, createServer, get, type Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { afterAll, afterEach, describe, expect, it } from 'vitest'
import { loadConfig } from '../../server/config.ts'
import { isPostgresUrl } from '../../server/db/sequelize.ts'
import { startServer } from '../../server/index.ts'
import { UserModel } from '../../server/models/index.ts'
import { closeGracefully } from '../../server/shutdown.ts'
import { sharedTestDatabase } from './helpers.ts'

const cleanups: (() => void)[] = []

afterEach(() => {
  for (const cleanup of cleanups.splice(0)) cleanup()
})

/** A server whose one route answers only when the test releases it; `arrived` settles once a request is being handled. */
async function heldServer() {
  let arrive: () => void = () => {}
  let release: () => void = () => {}
  const arrived = new Promise<void>((resolve) => (arrive = resolve))
  const released = new Promise<void>((resolve) => (release = resolve))
  const server: Server = createServer((_req, res) => {
    arrive()
    void released.then(() => res.end('answered'))
  })
  // Idle keep-alive connections then stay open until something closes them, instead of for Node's default 5 s.
  server.keepAliveTimeout = 0
  server.listen(0, '127.0.0.1')
  await new Promise((resolve) => server.once('listening', resolve))
  cleanups.push(() => server.closeAllConnections())
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/`
  return { server, url, arrived, release }
}

// A client that keeps its connections open until the server closes them, as browsers do for a while.
const agent = new Agent({ keepAlive: true })
afterAll(() => agent.destroy())

/** `200 body` for an answer, else the socket error's code. */
function outcome(url: string): Promise<string> {
  return new Promise((resolve) => {
    get(url, { agent }, (res) => {
      let body = ''
      res.on('data', (chunk) => (body += chunk)).on('end', () => resolve(`${res.statusCode} ${body}`))
    }).on('error', (err: NodeJS.ErrnoException) => resolve(err.code ?? err.message))
  })
}

describe('closeGracefully', () => {
  it('answers the request in flight and refuses new connections meanwhile', async () => {
    const { server, url, arrived, release } = await heldServer()
    const inFlight = outcome(url)
    await arrived

    const closing = closeGracefully(server, 60_000)
    const newcomer = await outcome(url)
    release()

    expect(newcomer).toBe('ECONNREFUSED')
    expect(await inFlight).toBe('200 answered')
    await closing
    expect(server.listening).toBe(false)
  })

  it('cuts a request still open when the grace period ends', async () => {
    const { server, url, arrived } = await heldServer()
    const inFlight = outcome(url)
    await arrived

    await closeGracefully(server, 0)

    expect(await inFlight).not.toMatch(/^200/)
  })
})

describe('the running server’s close (on SIGTERM)', () => {
  it('does not wait for idle keep-alive connections, and closes the database', async () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'plumbline-shutdown-'))
    cleanups.push(() => rmSync(dir, { recursive: true, force: true }))
    const location = await sharedTestDatabase(dir)
    // A grace period longer than the test's timeout: waiting for the idle connection would fail the test.
    const env = {
      PORT: '0',
      DATA_DIR: dir,
      DEMO: 'false',
      LOG_LEVEL: 'silent',
      PUBLIC_URL: 'https://plumbline.test',
      SHUTDOWN_GRACE_MS: '60000',
      ...(isPostgresUrl(location) && { DATABASE_URL: location }),
    }
    const running = await startServer(loadConfig(env))
    expect(await outcome(`${running.url}/api/health`)).toBe('200 {"status":"ok","demo":false}')

    await running.close()

    await expect(UserModel.count()).rejects.toThrow()
  })
})
