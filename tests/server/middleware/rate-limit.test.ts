import type { Request } from 'express'
import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { byAddressAndEmail } from '../../../server/middleware/rate-limit.ts'
import { makeTestApp } from '../helpers.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp({ loginAttempts: 1 }))
})

describe('credentials that are not text', () => {
  it.each([
    ['/api/auth/login', { email: { toString: 1 }, password: 'x' }, 'email'],
    ['/api/auth/login', { email: 'a@example.test', password: ['x'] }, 'password'],
    ['/api/auth/password-reset', { email: { toString: 1 } }, 'email'],
    ['/api/auth/set-password', { token: { length: 1 }, password: 'long enough password' }, 'token'],
  ])('POST %s responds 400 naming the field', async (path, body, field) => {
    const res = await request(app).post(path).send(body)

    expect(res.status).toBe(400)
    expect(res.body.error).toMatchObject({ code: 'invalid-input', fields: { [field]: 'Send this as text' } })
  })

  it('are not counted as sign-in attempts', async () => {
    await request(app)
      .post('/api/auth/login')
      .send({ email: { toString: 1 }, password: 'x' })

    const next = await request(app)
      .post('/api/auth/login')
      .send({ email: { toString: 1 }, password: 'x' })

    expect(next.status).toBe(400)
  })
})

describe('byAddressAndEmail', () => {
  it.each([undefined, null, 'text', { email: { toString: 1 } }, { email: Object.create(null) }, { email: 42 }])(
    'keys a body of %j by the address alone, without throwing',
    (body) => {
      expect(byAddressAndEmail({ ip: '192.0.2.1', body } as Request)).toBe('192.0.2.1|')
    },
  )

  it('keys an e-mail without regard to case or surrounding spaces', () => {
    expect(byAddressAndEmail({ ip: '192.0.2.1', body: { email: ' A@Example.TEST ' } } as Request)).toBe('192.0.2.1|a@example.test')
  })
})
