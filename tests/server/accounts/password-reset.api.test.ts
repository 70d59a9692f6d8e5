import jwt from 'jsonwebtoken'
import request from 'supertest'
import { describe, expect, it } from 'vitest'
import { PASSWORD_RESET_ACCEPTED } from '#shared/schemas/account'
import { AUDIENCE, ISSUER } from '../../../server/auth/tokens.ts'
import { AccountLinkModel, AuditEventModel, RefreshSessionModel } from '../../../server/models/index.ts'
import { makeUser, signIn, TEST_SECRET } from '../helpers.ts'
import { appWithMail, BASE_URL, NEW_PASSWORD, setPassword, tokenIn } from './harness.ts'

const askReset = (app: Parameters<typeof request>[0], email: string) => request(app).post('/api/auth/password-reset').send({ email })

describe('POST /api/auth/password-reset', () => {
  it('answers a known and an unknown address with the same status and body, and mails only the known one', async () => {
    const { app, delivered } = await appWithMail()
    await makeUser({ email: 'known@saltmarsh.test' })

    const known = await askReset(app, 'Known@saltmarsh.test')
    const unknown = await askReset(app, 'nobody@saltmarsh.test')
    const messages = await delivered()

    expect(known.status).toBe(202)
    expect(unknown.status).toBe(202)
    expect(known.body).toEqual(unknown.body)
    expect(known.body).toEqual(PASSWORD_RESET_ACCEPTED)
    expect(messages).toHaveLength(1)
    expect(messages[0]).toMatchObject({ to: ['known@saltmarsh.test'], subject: 'Reset your Plumbline password' })
    expect(messages[0]!.text).toContain(`${BASE_URL}/reset-password#token=`)
    // The trail records both requests, but never the address a stranger typed.
    const events = await AuditEventModel.findAll({ where: { action: 'password-reset-requested' } })
    expect(events).toHaveLength(2)
    expect(events.map((e) => e.changes).join()).not.toContain('nobody')
  })

  it('builds the link on the configured address, never on the Host header the caller sent', async () => {
    const { app, delivered } = await appWithMail()
    await makeUser({ email: 'victim@saltmarsh.test' })

    await request(app).post('/api/auth/password-reset').set('Host', 'attacker.example').send({ email: 'victim@saltmarsh.test' })
    const [message] = await delivered()

    expect(message!.text).toContain(`${BASE_URL}/reset-password#token=`)
    expect(message!.text).not.toContain('attacker.example')
  })

  it('sends nothing to a deactivated account, and still answers the same', async () => {
    const { app, delivered } = await appWithMail()
    await makeUser({ email: 'gone@saltmarsh.test', active: false, withPassword: false })

    const res = await askReset(app, 'gone@saltmarsh.test')

    expect(res.status).toBe(202)
    expect(res.body).toEqual(PASSWORD_RESET_ACCEPTED)
    expect(await delivered()).toHaveLength(0)
    expect(await AccountLinkModel.count()).toBe(0)
  })

  it('a malformed address gets a field error, not the neutral answer', async () => {
    const { app } = await appWithMail()

    const res = await askReset(app, 'not-an-address')

    expect(res.status).toBe(400)
    expect(Object.keys(res.body.error.fields)).toEqual(['email'])
  })

  it('issues reset links that expire after 1 hour', async () => {
    const { app, delivered } = await appWithMail()
    const user = await makeUser({ email: 'hour@saltmarsh.test', withPassword: false })

    const before = Date.now()
    await askReset(app, 'hour@saltmarsh.test')
    await delivered()
    const after = Date.now()

    const link = await AccountLinkModel.findOne({ where: { userId: user.id } })
    expect(link!.purpose).toBe('reset')
    expect(link!.createdBy).toBeNull()
    expect(link!.expiresAt.getTime()).toBeGreaterThanOrEqual(before + 60 * 60 * 1000)
    expect(link!.expiresAt.getTime()).toBeLessThanOrEqual(after + 60 * 60 * 1000)
  })

  it('using the link sets the new password, revokes every refresh session and refuses older access tokens', async () => {
    const { app, delivered } = await appWithMail()
    const user = await makeUser({ email: 'reset@saltmarsh.test' })
    const session = await signIn(app, 'reset@saltmarsh.test')
    // An access token issued a minute before the reset (iat has whole seconds, so "now" would be ambiguous).
    const oldAccess = jwt.sign({ roles: ['resident'], iat: Math.floor(Date.now() / 1000) - 60 }, TEST_SECRET, {
      algorithm: 'HS256', subject: user.id, issuer: ISSUER, audience: AUDIENCE, expiresIn: 900,
    })
    expect((await request(app).get('/api/me').set('Authorization', `Bearer ${oldAccess}`)).status).toBe(200)
    await askReset(app, 'reset@saltmarsh.test')
    const token = tokenIn((await delivered())[0])

    const res = await setPassword(app, token)
    const refreshed = await request(app).post('/api/auth/refresh').set('Cookie', session.cookie)
    const me = await request(app).get('/api/me').set('Authorization', `Bearer ${oldAccess}`)
    const oldPassword = await signIn(app, 'reset@saltmarsh.test')
    const newPassword = await signIn(app, 'reset@saltmarsh.test', NEW_PASSWORD)

    expect(res.status).toBe(200)
    expect(res.body).toEqual({ email: 'reset@saltmarsh.test', purpose: 'reset' })
    expect(refreshed.status).toBe(401)
    expect(me.status).toBe(401)
    expect(oldPassword.res.status).toBe(401)
    expect(newPassword.res.status).toBe(200)
    expect(await RefreshSessionModel.count({ where: { userId: user.id, revokedAt: null } })).toBe(1) // the new sign-in only
    expect(await AuditEventModel.count({ where: { action: 'password-reset-used', entityId: user.id } })).toBe(1)
    expect((await setPassword(app, token, 'yet another long harbour phrase')).body.error.code).toBe('invalid-link')
  })

  it('only the newest reset link works', async () => {
    const { app, delivered } = await appWithMail()
    await makeUser({ email: 'twice@saltmarsh.test', withPassword: false })
    await askReset(app, 'twice@saltmarsh.test')
    const first = tokenIn((await delivered())[0])
    await askReset(app, 'twice@saltmarsh.test')
    const second = tokenIn((await delivered())[1])

    const old = await setPassword(app, first)
    const fresh = await setPassword(app, second)

    expect(old.body.error.code).toBe('invalid-link')
    expect(fresh.status).toBe(200)
  })

  it('after 5 requests for one address in 15 minutes, answers 429', async () => {
    const { app } = await appWithMail()

    const statuses: number[] = []
    for (let i = 0; i < 6; i++) statuses.push((await askReset(app, 'flood@saltmarsh.test')).status)

    expect(statuses).toEqual([202, 202, 202, 202, 202, 429])
  })
})

describe('POST /api/auth/set-password', () => {
  it('after 10 failed attempts from one address in 15 minutes, answers 429', async () => {
    const { app } = await appWithMail()

    const statuses: number[] = []
    for (let i = 0; i < 11; i++) statuses.push((await setPassword(app, `guess-${i}`)).status)

    expect(statuses.slice(0, 10)).toEqual(Array(10).fill(400))
    expect(statuses[10]).toBe(429)
  })
})
