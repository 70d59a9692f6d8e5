import { promisify } from 'node:util'
import { brotliCompress, constants, gzip } from 'node:zlib'
import type { Request, Response } from 'express'
import { COMPRESS_ABOVE_BYTES } from './compression.ts'
import { ttlLru, type Clock } from './ttl-lru.ts'

type Encoding = 'br' | 'gzip' | 'identity'

interface Answer {
  json: Buffer
  encoded: Map<Encoding, Promise<Buffer>>
  storedAt: number
}

/** Past this share of its time to live, a hit also rebuilds the answer in the background, so readers never wait for it. */
const REFRESH_AFTER = 0.6

// Quality 4 as the compression middleware uses for dynamic answers: quality 11 is meant for files compressed once, at build.
const brotliOptions = { params: { [constants.BROTLI_PARAM_QUALITY]: 4, [constants.BROTLI_PARAM_MODE]: constants.BROTLI_MODE_TEXT } }
const encoders: Record<Exclude<Encoding, 'identity'>, (json: Buffer) => Promise<Buffer>> = {
  br: (json) => promisify(brotliCompress)(json, brotliOptions),
  gzip: (json) => promisify(gzip)(json),
}

/** Brotli when accepted, else gzip, else none; a small answer goes as it is, as the compression middleware does. */
export function encodingFor(req: Request, bytes: number): Encoding {
  if (bytes <= COMPRESS_ABOVE_BYTES) return 'identity'
  if (req.acceptsEncodings('br') === 'br') return 'br'
  return req.acceptsEncodings('gzip') === 'gzip' ? 'gzip' : 'identity'
}

export interface AnswerCache {
  /**
   * Sends the JSON answer stored under `key`, compressed as the client accepts; on a miss builds it (once, however
   * many requests wait for it), stores it and sends it. A build that throws stores nothing and passes the error on.
   */
  send(req: Request, res: Response, key: string, build: () => Promise<unknown>): Promise<void>
  clear(): void
}

export interface AnswerCacheOptions {
  maxBytes: number
  ttlMs: number
  now?: Clock
}

/** Whole JSON answers, each kept with its compressed copies, bounded in bytes and in age. */
export function answerCache({ maxBytes, ttlMs, now = () => Date.now() }: AnswerCacheOptions): AnswerCache {
  // The compressed copies are a fraction of the JSON: a quarter more bounds them.
  const answers = ttlLru<Answer>({ maxWeight: maxBytes, ttlMs, now, weigh: (a) => Math.ceil(a.json.length * 1.25) })
  const building = new Map<string, Promise<Answer>>()
  const rebuild = (key: string, build: () => Promise<unknown>): Promise<Answer> => {
    const pending =
      building.get(key) ??
      build()
        .then((value) => {
          const answer = { json: Buffer.from(JSON.stringify(value)), encoded: new Map(), storedAt: now() }
          answers.set(key, answer)
          return answer
        })
        .finally(() => building.delete(key))
    building.set(key, pending)
    return pending
  }
  const answerFor = (key: string, build: () => Promise<unknown>): Answer | Promise<Answer> => {
    const stored = answers.get(key)
    if (!stored) return rebuild(key, build)
    // Served only within its time to live: the rebuild replaces it for the readers after.
    if (now() - stored.storedAt > ttlMs * REFRESH_AFTER && !building.has(key)) rebuild(key, build).catch(() => undefined)
    return stored
  }
  return {
    async send(req, res, key, build) {
      const answer = await answerFor(key, build)
      const encoding = encodingFor(req, answer.json.length)
      if (encoding !== 'identity' && !answer.encoded.has(encoding)) {
        const encoded = encoders[encoding](answer.json)
        // A failed compression is tried again by the next request rather than kept.
        encoded.catch(() => answer.encoded.delete(encoding))
        answer.encoded.set(encoding, encoded)
      }
      const body = encoding === 'identity' ? answer.json : await answer.encoded.get(encoding)!
      res.vary('Accept-Encoding')
      res.setHeader('Content-Type', 'application/json; charset=utf-8')
      if (encoding !== 'identity') res.setHeader('Content-Encoding', encoding)
      res.setHeader('Content-Length', body.length)
      res.end(body)
    },
    clear() {
      answers.clear()
    },
  }
}
