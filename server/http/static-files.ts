import path from 'node:path'
import type { ServerResponse } from 'node:http'
import type { Express } from 'express'
import expressStaticGzip from 'express-static-gzip'

/** Vite puts a content hash in every file name under assets/: a changed file is a new URL, so it may be kept for good. */
export const IMMUTABLE = 'public, max-age=31536000, immutable'
/** Everything else (index.html, the service worker, workbox, the manifest, icons) is checked with the server each time. */
export const REVALIDATE = 'no-cache'

/** The cache policy of a built client file, by its path within the client folder (a `.br`/`.gz` twin included). */
export function cacheControlFor(relativePath: string): string {
  const parts = relativePath.split(/[\\/]/).filter(Boolean)
  return parts[0] === 'assets' && parts.length > 1 ? IMMUTABLE : REVALIDATE
}

const READS = new Set(['GET', 'HEAD'])

/**
 * Serves the built client: the `.br` (preferred) or `.gz` file written beside the original at build time when the
 * client accepts it, else the file itself; unknown non-API GETs (and HEADs, which answer as GET would, without the body:
 * RFC 9110 9.3.2) get index.html, for the client's router.
 */
export function serveClient(app: Express, dir: string): void {
  const files = expressStaticGzip(dir, {
    index: false,
    enableBrotli: true,
    orderPreference: ['br', 'gzip'],
    serveStatic: {
      cacheControl: false,
      setHeaders: (res: ServerResponse, file: string) => res.setHeader('Cache-Control', cacheControlFor(path.relative(dir, file))),
    },
  })
  app.use(files)
  app.use((req, res, next) => {
    if (!READS.has(req.method) || req.path.startsWith('/api')) return next()
    req.url = '/index.html'
    files(req, res, next)
  })
}
