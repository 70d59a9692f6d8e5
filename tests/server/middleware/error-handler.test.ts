import { gzipSync } from 'node:zlib'
import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { WORKED_EXAMPLE_FINDINGS } from '../../../tests/shared/worked-example.ts'
import { makeCaller, makeTestApp } from '../helpers.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']
let auth: string

beforeEach(async () => {
  ;({ app } = await makeTestApp())
  ;({ auth } = await makeCaller())
})

const estimate = () => request(app).post('/api/estimate').set('Authorization', auth)
const findings = JSON.stringify(WORKED_EXAMPLE_FINDINGS)

describe('request bodies the server cannot read', () => {
  it('when the charset is not one it reads, responds 415', async () => {
    const res = await estimate().set('Content-Type', 'application/json; charset=bogus').send(findings)

    expect(res.status).toBe(415)
    expect(res.body.error.code).toBe('unsupported-charset')
  })

  it('when the content encoding is not one it reads, responds 415', async () => {
    const res = await estimate().set('Content-Type', 'application/json').set('Content-Encoding', 'compress').send(findings)

    expect(res.status).toBe(415)
    expect(res.body.error.code).toBe('unsupported-encoding')
  })

  it('when a body declared gzip is plain text, responds 400', async () => {
    const res = await estimate().set('Content-Type', 'application/json').set('Content-Encoding', 'gzip').send(findings)

    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid-body')
  })

  it('reads a body that is gzip as declared', async () => {
    // superagent would JSON-encode a Buffer sent as application/json; send the bytes as they are.
    const res = await estimate()
      .set('Content-Type', 'application/json')
      .set('Content-Encoding', 'gzip')
      .serialize((body: Buffer) => body as unknown as string)
      .send(gzipSync(findings))

    expect(res.status).toBe(200)
    expect(res.body.bound).toBe('point')
  })

  it('when the JSON is malformed, responds 400', async () => {
    const res = await estimate().set('Content-Type', 'application/json').send('{"inclinationDeg": ')

    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid-json')
  })
})
