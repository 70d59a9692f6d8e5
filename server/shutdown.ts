import type { Server } from 'node:http'
import { setTimeout as delay } from 'node:timers/promises'
import { closePasswordHashing } from './auth/passwords.ts'
import type { Mailer } from './mail/mailer.ts'

/**
 * Stops taking connections and resolves once the requests in flight have been answered; whatever is still open after
 * `graceMs` is cut. Keep-alive connections are closed as soon as they fall idle: `server.close()` alone would wait
 * for the client to drop them. https://nodejs.org/api/http.html#serverclosecallback
 */
export function closeGracefully(server: Server, graceMs: number): Promise<void> {
  return new Promise((resolve) => {
    const idle = setInterval(() => server.closeIdleConnections(), 50)
    const cut = setTimeout(() => server.closeAllConnections(), graceMs)
    server.close(() => {
      clearInterval(idle)
      clearTimeout(cut)
      resolve()
    })
    server.closeIdleConnections()
  })
}

export interface RunningParts {
  server: Server
  graceMs: number
  mailer: Pick<Mailer, 'idle' | 'close'>
  fakeSmtp?: { close(): Promise<void> }
  sequelize: { close(): Promise<void> }
}

/**
 * A graceful stop, in order: the requests in flight (at most `graceMs`), then queued e-mail (at most 5 s), then the
 * password-hashing threads, whose last sign-ins have been answered, and the database, whose last writes have committed.
 */
export async function shutDown(parts: RunningParts): Promise<void> {
  await closeGracefully(parts.server, parts.graceMs)
  await Promise.race([parts.mailer.idle(), delay(5_000, undefined, { ref: false })])
  parts.mailer.close()
  await parts.fakeSmtp?.close()
  await closePasswordHashing()
  await parts.sequelize.close()
}
