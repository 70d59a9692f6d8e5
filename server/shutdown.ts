import type { Server } from 'node:http'

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
