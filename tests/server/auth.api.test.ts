import { generateKeyPairSync } from 'node:crypto'
import bcrypt from 'bcryptjs'
import jwt from 'jsonwebtoken'
import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { BCRYPT_COST } from '../../server/auth/passwords.ts'
import { AUDIENCE, ISSUER } from '../../server/auth/tokens.ts'
import { AuditEventModel, RefreshSessionModel } from '../../server/models/index.ts'
import { makeTeam, makeTestApp, makeUser, PASSWORD, signIn, TEST_SECRET } from './helpers.ts'

type App = Awaited<ReturnType<typeof makeTestApp>>['app']
let app: App

beforeEach(async () => {
  ;({ app } = await makeTestApp({ loginAttempts: 5 }))
})

function tokenFor(userId: string, opts: jwt.SignOptions = {}, secret: jwt.Secret = TEST_SECRET) {
  return jwt.sign({ roles: ['resident'] }, secret, {
    algorithm: 'HS256',
    subject: userId,
    issuer: ISSUER,
    audience: AUDIENCE,
    expiresIn: 900,
    ...opts,
  })
}

describe('POST /api/auth/login', () => {
  it('with the right password, answers a token, the user and an httpOnly SameSite=Strict refresh cookie', async () => {
    const team = await makeTeam('Ward A')
    const user = await makeUser({ email: 'a@example.test', roles: ['resident'], teamIds: [team.id] })

    const { res } = await signIn(app, 'A@Example.test')

    expect(res.status).toBe(200)
    expect(res.body.user).toMatchObject({ id: user.id, roles: ['resident'], teams: [{ name: 'Ward A' }] })
    expect(res.body.user.passwordHash).toBeUndefined()
    const cookie = String(res.headers['set-cookie'])
    expect(cookie).toMatch(/HttpOnly/)
    expect(cookie).toMatch(/SameSite=Strict/)
    expect(await AuditEventModel.count({ where: { action: 'login', actorId: user.id } })).toBe(1)
  })

  it('stores passwords with bcrypt at the configured work factor and raises an older, weaker hash at the next sign-in', async () => {
    // The production work factor (≥ 13, OWASP ASVS 2.4.4) is tested in config.test.ts; the test runner lowers it.
    const user = await makeUser({ email: 'old-hash@example.test' })
    await user.update({ passwordHash: await bcrypt.hash(PASSWORD, BCRYPT_COST - 1) })

    const { res } = await signIn(app, 'old-hash@example.test')

    expect(res.status).toBe(200)
    await user.reload()
    expect(bcrypt.getRounds(user.passwordHash!)).toBe(BCRYPT_COST)
    expect(await bcrypt.compare(PASSWORD, user.passwordHash!)).toBe(true)
  })

  it('with a wrong password or an unknown e-mail, answers the same 401 and audits the failure', async () => {
    await makeUser({ email: 'b@example.test' })

    const wrong = await signIn(app, 'b@example.test', 'not-the-password')
    const unknown = await signIn(app, 'nobody@example.test')

    expect(wrong.res.status).toBe(401)
    expect(unknown.res.status).toBe(401)
    expect(wrong.res.body).toEqual(unknown.res.body)
    expect(wrong.res.body.error.code).toBe('invalid-credentials')
    expect(await AuditEventModel.count({ where: { action: 'login-failed' } })).toBe(2)
  })

  it('with a malformed e-mail and no password, answers 400 naming both fields', async () => {
    const res = await request(app).post('/api/auth/login').send({ email: 'not-an-email', password: '' })

    expect(res.status).toBe(400)
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['email', 'password'])
  })

  it('refuses a deactivated account', async () => {
    await makeUser({ email: 'gone@example.test', active: false })

    const { res } = await signIn(app, 'gone@example.test')

    expect(res.status).toBe(401)
  })

  it('after repeated failures for one account, answers 429', async () => {
    await makeUser({ email: 'c@example.test' })

    const statuses: number[] = []
    for (let i = 0; i < 6; i++) statuses.push((await signIn(app, 'c@example.test', 'wrong')).res.status)

    expect(statuses.slice(0, 5)).toEqual([401, 401, 401, 401, 401])
    expect(statuses[5]).toBe(429)
  })

  it('answers 413 to a body over the limit', async () => {
    const res = await request(app)
      .post('/api/auth/login')
      .set('Content-Type', 'application/json')
      .send(JSON.stringify({ email: 'a@example.test', password: 'x'.repeat(300_000) }))

    expect(res.status).toBe(413)
    expect(res.body.error.code).toBe('too-large')
  })
})

describe('access tokens on GET /api/me', () => {
  it('accepts a valid token', async () => {
    const user = await makeUser({ email: 'd@example.test' })
    const { token } = await signIn(app, 'd@example.test')

    const res = await request(app).get('/api/me').set('Authorization', `Bearer ${token}`)

    expect(res.status).toBe(200)
    expect(res.body.id).toBe(user.id)
  })

  it.each([
    ['missing', () => ''],
    ['expired', (id: string) => tokenFor(id, { expiresIn: -10 })],
    ['signed with another secret', (id: string) => tokenFor(id, {}, 'another-secret'.padEnd(64, 'y'))],
    ['for another audience', (id: string) => tokenFor(id, { audience: 'someone-else' })],
    ['from another issuer', (id: string) => tokenFor(id, { issuer: 'someone-else' })],
    ['unsigned (alg none)', (id: string) => jwt.sign({ roles: ['admin'], sub: id, iss: ISSUER, aud: AUDIENCE }, '', { algorithm: 'none' })],
  ])('refuses a %s token with 401', async (_name, make) => {
    const user = await makeUser()

    const res = await request(app).get('/api/me').set('Authorization', `Bearer ${make(user.id)}`)

    expect(res.status).toBe(401)
  })

  it('refuses a token whose payload was altered after signing', async () => {
    const user = await makeUser()
    const [head, , sig] = tokenFor(user.id).split('.')
    const body = Buffer.from(JSON.stringify({ sub: user.id, roles: ['admin'], iss: ISSUER, aud: AUDIENCE })).toString('base64url')

    const res = await request(app).get('/api/me').set('Authorization', `Bearer ${head}.${body}.${sig}`)

    expect(res.status).toBe(401)
  })

  it('refuses an HS256 token signed with an RSA public key', async () => {
    const user = await makeUser()
    const { publicKey } = generateKeyPairSync('rsa', { modulusLength: 2048 })
    const pem = publicKey.export({ type: 'spki', format: 'pem' })
    const forged = tokenFor(user.id, {}, Buffer.from(pem))

    const res = await request(app).get('/api/me').set('Authorization', `Bearer ${forged}`)

    expect(res.status).toBe(401)
  })
})

describe('role guard', () => {
  it('answers 403 when a resident asks for the admin account list, 200 for an admin', async () => {
    await makeUser({ email: 'r@example.test', roles: ['resident'] })
    await makeUser({ email: 'adm@example.test', roles: ['admin'] })
    const resident = await signIn(app, 'r@example.test')
    const admin = await signIn(app, 'adm@example.test')

    const denied = await request(app).get('/api/admin/users').set('Authorization', `Bearer ${resident.token}`)
    const allowed = await request(app).get('/api/admin/users').set('Authorization', `Bearer ${admin.token}`)

    expect(denied.status).toBe(403)
    expect(allowed.status).toBe(200)
    expect(allowed.body.users).toHaveLength(2)
  })

  it('shows a resident only the teams they belong to', async () => {
    const mine = await makeTeam('Mine')
    await makeTeam('Other')
    await makeUser({ email: 'r2@example.test', teamIds: [mine.id] })
    const { token } = await signIn(app, 'r2@example.test')

    const res = await request(app).get('/api/teams').set('Authorization', `Bearer ${token}`)

    expect(res.body.teams.map((t: { name: string }) => t.name)).toEqual(['Mine'])
  })
})

describe('refresh and logout', () => {
  it('rotates the refresh token: the new one works, the used one is refused and ends the family', async () => {
    await makeUser({ email: 'e@example.test' })
    const { cookie } = await signIn(app, 'e@example.test')

    const first = await request(app).post('/api/auth/refresh').set('Cookie', cookie)
    const replay = await request(app).post('/api/auth/refresh').set('Cookie', cookie)
    const afterReplay = await request(app).post('/api/auth/refresh').set('Cookie', first.headers['set-cookie'] as unknown as string[])

    expect(first.status).toBe(200)
    expect(first.body.token).toEqual(expect.any(String))
    expect(replay.status).toBe(401)
    expect(afterReplay.status).toBe(401)
  })

  it('of two refreshes with the same token at the same moment, at most one succeeds (reuse detection holds)', async () => {
    await makeUser({ email: 'g@example.test' })
    const { cookie } = await signIn(app, 'g@example.test')

    const both = await Promise.all([0, 1].map(() => request(app).post('/api/auth/refresh').set('Cookie', cookie)))

    expect(both.filter((res) => res.status === 200).length).toBeLessThanOrEqual(1)
    expect(both.every((res) => res.status === 200 || res.status === 401)).toBe(true)
  })

  it('when no refresh cookie is sent (nobody signed in), answers 204 with no body and sets no cookie', async () => {
    const res = await request(app).post('/api/auth/refresh')

    expect(res.status).toBe(204)
    expect(res.text).toBe('')
    expect(res.headers['set-cookie']).toBeUndefined()
  })

  it('when the refresh cookie is present but unknown, answers 401 session-expired', async () => {
    const res = await request(app).post('/api/auth/refresh').set('Cookie', 'plumbline_refresh=not-a-real-token')

    expect(res.status).toBe(401)
    expect(res.body.error.code).toBe('session-expired')
  })

  it('when the refresh cookie is present but empty, answers 401 session-expired', async () => {
    const res = await request(app).post('/api/auth/refresh').set('Cookie', 'plumbline_refresh=')

    expect(res.status).toBe(401)
    expect(res.body.error.code).toBe('session-expired')
  })

  it('logout revokes the refresh token and is audited', async () => {
    const user = await makeUser({ email: 'f@example.test' })
    const { cookie } = await signIn(app, 'f@example.test', PASSWORD)

    const out = await request(app).post('/api/auth/logout').set('Cookie', cookie)
    const again = await request(app).post('/api/auth/refresh').set('Cookie', cookie)

    expect(out.status).toBe(204)
    expect(again.status).toBe(401)
    expect(await RefreshSessionModel.count({ where: { userId: user.id, revokedAt: null } })).toBe(0)
    expect(await AuditEventModel.count({ where: { action: 'logout', actorId: user.id } })).toBe(1)
  })
})

describe('GET /api/health', () => {
  it('answers ok', async () => {
    const res = await request(app).get('/api/health')

    expect(res.body).toEqual({ status: 'ok', demo: false })
  })
})
