import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { recordExam } from '../factories/exam.ts'
import { COMPRESS_ABOVE_BYTES } from '../../../server/http/compression.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']
let auth: string

beforeEach(async () => {
  ;({ app } = await makeTestApp())
  const team = await makeTeam()
  ;({ auth } = await makeCaller({ teamIds: [team.id] }))
  // Three exams make a list answer of several kilobytes.
  for (const notes of ['first', 'second', 'third']) await recordExam(app, auth, { teamId: team.id, notes })
})

const examLog = (encoding?: string) => {
  const req = request(app).get('/api/exams').set('Authorization', auth)
  return encoding === undefined ? req : req.set('Accept-Encoding', encoding)
}

describe('compression of API answers', () => {
  it('when the client accepts brotli and gzip, answers a large list in brotli', async () => {
    const res = await examLog('gzip, br')

    expect(res.status).toBe(200)
    expect(res.headers['content-encoding']).toBe('br')
    expect(res.headers.vary).toMatch(/Accept-Encoding/i)
  })

  it('when the client accepts gzip only, answers in gzip with the same content', async () => {
    const plain = await examLog('identity')

    const res = await examLog('gzip')

    expect(res.headers['content-encoding']).toBe('gzip')
    expect(res.body).toEqual(plain.body)
  })

  it('when the client accepts no encoding, answers uncompressed', async () => {
    const res = await examLog('identity')

    expect(res.status).toBe(200)
    expect(res.headers['content-encoding']).toBeUndefined()
    expect(Number(res.headers['content-length'])).toBeGreaterThan(COMPRESS_ABOVE_BYTES)
  })

  it('answers a tiny body uncompressed even when the client accepts brotli', async () => {
    const res = await request(app).get('/api/health').set('Accept-Encoding', 'br, gzip')

    expect(Number(res.headers['content-length'])).toBeLessThan(COMPRESS_ABOVE_BYTES)
    expect(res.headers['content-encoding']).toBeUndefined()
  })

  it('keeps API answers out of every cache, compressed or not', async () => {
    const res = await examLog('br')

    expect(res.headers['cache-control']).toBe('no-store')
  })

  it('when the client refuses brotli (br;q=0), answers in gzip', async () => {
    const res = await examLog('br;q=0, gzip')

    expect(res.headers['content-encoding']).toBe('gzip')
  })

  it('sends one stored answer in each encoding asked for, the same content each time', async () => {
    const [br, gzip, plain] = [await examLog('br'), await examLog('gzip'), await examLog('identity')]

    expect([br, gzip, plain].map((r) => r.headers['content-encoding'])).toEqual(['br', 'gzip', undefined])
    expect(br.body).toEqual(plain.body)
    expect(gzip.body).toEqual(plain.body)
    expect(plain.body.exams).toHaveLength(3)
  })

  it('compresses the sync pull as the client accepts, with the same content as uncompressed', async () => {
    const pull = (encoding: string) => request(app).get('/api/sync/pull?cursor=0').set('Authorization', auth).set('Accept-Encoding', encoding)

    const [br, plain] = [await pull('gzip, br'), await pull('identity')]

    expect(br.headers['content-encoding']).toBe('br')
    expect(br.headers.vary).toMatch(/Accept-Encoding/i)
    expect(br.body).toEqual(plain.body)
    expect(plain.body.exams).toHaveLength(3)
  })
})
