import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { brotliCompressSync, gzipSync } from 'node:zlib'
import request from 'supertest'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { makeTestApp } from '../helpers.ts'

const IMMUTABLE = 'public, max-age=31536000, immutable'
const SCRIPT = `console.log(${JSON.stringify('x'.repeat(2000))})`
const INDEX = '<!doctype html><title>Plumbline</title>'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']
let dir: string

function write(file: string, text: string, twins = false) {
  mkdirSync(path.dirname(path.join(dir, file)), { recursive: true })
  writeFileSync(path.join(dir, file), text)
  if (!twins) return
  writeFileSync(path.join(dir, `${file}.br`), brotliCompressSync(text))
  writeFileSync(path.join(dir, `${file}.gz`), gzipSync(text))
}

/** A built client as Vite and the PWA plugin lay it out, with .br/.gz twins for some files only. */
beforeEach(async () => {
  dir = mkdtempSync(path.join(tmpdir(), 'plumbline-client-'))
  write('index.html', INDEX, true)
  write('assets/index-DkX3a9.js', SCRIPT, true)
  write('assets/index-Bq81c0.css', 'body{margin:0}')
  write('sw.js', SCRIPT, true)
  write('workbox-5f2b1e0c.js', SCRIPT)
  write('manifest.webmanifest', '{"name":"Plumbline"}')
  ;({ app } = await makeTestApp({ clientDir: dir }))
})

afterEach(() => rmSync(dir, { recursive: true, force: true }))

describe('serving the built client', () => {
  it('when the client accepts brotli, sends the .br twin of a hashed asset, cached for a year as immutable', async () => {
    const res = await request(app).get('/assets/index-DkX3a9.js').set('Accept-Encoding', 'gzip, deflate, br')

    expect(res.status).toBe(200)
    expect(res.headers['content-encoding']).toBe('br')
    expect(res.headers['content-type']).toMatch(/javascript/)
    expect(res.headers.vary).toMatch(/Accept-Encoding/i)
    expect(res.headers['cache-control']).toBe(IMMUTABLE)
    expect(res.text).toBe(SCRIPT)
  })

  it('when the client accepts gzip only, sends the .gz twin', async () => {
    const res = await request(app).get('/assets/index-DkX3a9.js').set('Accept-Encoding', 'gzip')

    expect(res.headers['content-encoding']).toBe('gzip')
    expect(res.text).toBe(SCRIPT)
  })

  it('sends the file itself when no twin exists or no encoding is accepted, with the same cache policy', async () => {
    const css = await request(app).get('/assets/index-Bq81c0.css').set('Accept-Encoding', 'br')
    const plain = await request(app).get('/assets/index-DkX3a9.js').set('Accept-Encoding', 'identity')

    expect(css.headers['content-encoding']).toBeUndefined()
    expect(css.headers['cache-control']).toBe(IMMUTABLE)
    expect(plain.headers['content-encoding']).toBeUndefined()
    expect(plain.headers['cache-control']).toBe(IMMUTABLE)
  })

  it.each(['/sw.js', '/workbox-5f2b1e0c.js', '/manifest.webmanifest', '/index.html'])(
    'has browsers check %s with the server on every visit (no-cache)',
    async (file) => {
      const res = await request(app).get(file).set('Accept-Encoding', 'br')

      expect(res.status).toBe(200)
      expect(res.headers['cache-control']).toBe('no-cache')
    },
  )

  it('answers a route of the client’s router with index.html, precompressed and not cached unchecked', async () => {
    const res = await request(app).get('/exams/some-id').set('Accept-Encoding', 'br')

    expect(res.status).toBe(200)
    expect(res.headers['content-encoding']).toBe('br')
    expect(res.headers['cache-control']).toBe('no-cache')
    expect(res.text).toBe(INDEX)
  })

  it('leaves unknown API paths to the API, which answers an error in JSON rather than index.html', async () => {
    const res = await request(app).get('/api/nothing-here')

    expect(res.status).toBeGreaterThanOrEqual(400)
    expect(res.headers['content-type']).toMatch(/json/)
    expect(res.body.error.code).toEqual(expect.any(String))
  })

  it.each(['/', '/exams/some-id'])('answers HEAD %s as GET would, with the headers of index.html and no body', async (route) => {
    const get = await request(app).get(route).set('Accept-Encoding', 'identity')

    const head = await request(app).head(route).set('Accept-Encoding', 'identity')

    expect(head.status).toBe(200)
    expect(head.headers['content-type']).toBe(get.headers['content-type'])
    expect(head.headers['content-length']).toBe(String(INDEX.length))
    expect(head.headers['cache-control']).toBe('no-cache')
    expect(head.text ?? '').toBe('')
  })
})
