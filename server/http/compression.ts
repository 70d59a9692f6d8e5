import compression from 'compression'
import type { RequestHandler } from 'express'

/** Below this an answer goes as it is: the headers and the work of compressing would outweigh the bytes saved. */
export const COMPRESS_ABOVE_BYTES = 1024

/**
 * Brotli (quality 4, the package's default: fast enough per request) or gzip, as the client accepts, for compressible
 * answers above the threshold; `compression` sets `Vary: Accept-Encoding` so a cache keeps one copy per encoding.
 */
export function compressAnswers(): RequestHandler {
  return compression({ threshold: COMPRESS_ABOVE_BYTES })
}
