import request from 'supertest'
import { describe, expect, it } from 'vitest'
import { hashToken } from '../../../server/auth/tokens.ts'
import { sendInvitation } from '../../../server/accounts/invitations.ts'
import { AccountLinkModel, AuditEventModel, UserModel } from '../../../server/models/index.ts'
import { makeCaller, makeTeam, makeUser, signIn } from '../helpers.ts'
import { appWithMail, BASE_URL, NEW_PASSWORD, setPassword, tokenIn } from './harness.ts'

const INVITEE = { email: 'Nadia.Ferreira@Saltmarsh.test', displayName: 'Dr Nadia Ferreira', roles: ['resident'] }

async function invite(app: Parameters<typeof request>[0], auth: string, body: Record<string, unknown>) {
  return request(app).post('/api/admin/accounts').set('Authorization', auth).send(body)
}

describe('POST /api/admin/accounts (invite)', () => {
  it('creates an account without a password and e-mails a one-time link that names the inviter', async () => {
    const { app, delivered } = await appWithMail()
    const admin = await makeCaller({ roles: ['admin'], displayName: 'Morgan Reyes' })
    const team = await makeTeam('Acute Medical Unit')

    const res = await invite(app, admin.auth, { ...INVITEE, teamIds: [team.id] })
    const messages = await delivered()

    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({
      email: 'nadia.ferreira@saltmarsh.test',
      status: 'invited',
      roles: ['resident'],
      teams: [{ id: team.id, name: 'Acute Medical Unit' }],
    })
    const row = await UserModel.findByPk(res.body.id)
    expect(row!.passwordHash).toBeNull()
    expect(row!.invitedAt).not.toBeNull()
    expect(messages).toHaveLength(1)
    expect(messages[0]).toMatchObject({ to: ['nadia.ferreira@saltmarsh.test'], subject: 'Morgan Reyes invites you to Plumbline' })
    expect(messages[0]!.text).toContain(`${BASE_URL}/invitation#token=`)
    expect(messages[0]!.text).toContain('Hello Dr Nadia Ferreira')
    // Only the token's hash is stored.
    const token = tokenIn(messages[0])
    const link = await AccountLinkModel.findOne({ where: { userId: res.body.id } })
    expect(link!.tokenHash).toBe(hashToken(token))
    expect(link!.tokenHash).not.toContain(token)
    expect(link).toMatchObject({ purpose: 'invitation', createdBy: admin.user.id, usedAt: null })
    expect(await AuditEventModel.count({ where: { action: 'account-invited', entityId: res.body.id, actorId: admin.user.id } })).toBe(1)
    expect(await AuditEventModel.count({ where: { action: 'invitation-sent', entityId: res.body.id } })).toBe(1)
  })

  it('the link sets the password once; the new account then signs in, and the link answers "invalid" after that', async () => {
    const { app, delivered } = await appWithMail()
    const admin = await makeCaller({ roles: ['admin'] })
    await invite(app, admin.auth, INVITEE)
    const token = tokenIn((await delivered())[0])

    const first = await setPassword(app, token)
    const second = await setPassword(app, token, 'another long harbour phrase')
    const signedIn = await signIn(app, INVITEE.email, NEW_PASSWORD)

    expect(first.status).toBe(200)
    expect(first.body).toEqual({ email: 'nadia.ferreira@saltmarsh.test', purpose: 'invitation' })
    expect(second.status).toBe(400)
    expect(second.body.error.code).toBe('invalid-link')
    expect(signedIn.res.status).toBe(200)
    expect(signedIn.res.body.user).toMatchObject({ email: 'nadia.ferreira@saltmarsh.test', roles: ['resident'] })
    expect(await AuditEventModel.count({ where: { action: 'invitation-accepted' } })).toBe(1)
  })

  it('an expired, a used and an unknown token all get the same answer', async () => {
    const { app, delivered } = await appWithMail()
    const admin = await makeCaller({ roles: ['admin'] })
    const a = await invite(app, admin.auth, { ...INVITEE, email: 'a@saltmarsh.test' })
    await invite(app, admin.auth, { ...INVITEE, email: 'b@saltmarsh.test' })
    const messages = await delivered()
    const expiring = tokenIn(messages.find((m) => m.to[0] === 'a@saltmarsh.test'))
    const used = tokenIn(messages.find((m) => m.to[0] === 'b@saltmarsh.test'))
    // The invitation's 7 days have passed: moved in the database rather than waiting.
    await AccountLinkModel.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { userId: a.body.id } })
    expect((await setPassword(app, used)).status).toBe(200)

    const expired = await setPassword(app, expiring)
    const usedAgain = await setPassword(app, used)
    const unknown = await setPassword(app, 'not-a-token-we-ever-issued')

    expect(expired.status).toBe(400)
    expect(usedAgain.status).toBe(400)
    expect(unknown.status).toBe(400)
    expect(expired.body).toEqual(unknown.body)
    expect(usedAgain.body).toEqual(unknown.body)
    expect(unknown.body.error.code).toBe('invalid-link')
    expect((await UserModel.findByPk(a.body.id))!.passwordHash).toBeNull()
  })

  it('issues invitation links that expire after 7 days', async () => {
    const { app } = await appWithMail()
    const admin = await makeCaller({ roles: ['admin'] })

    const before = Date.now()
    const res = await invite(app, admin.auth, INVITEE)
    const after = Date.now()

    const link = await AccountLinkModel.findOne({ where: { userId: res.body.id } })
    const week = 7 * 24 * 60 * 60 * 1000
    expect(link!.expiresAt.getTime()).toBeGreaterThanOrEqual(before + week)
    expect(link!.expiresAt.getTime()).toBeLessThanOrEqual(after + week)
  })

  it('a resent invitation replaces the earlier link, which stops working', async () => {
    const { app, delivered } = await appWithMail()
    const admin = await makeCaller({ roles: ['admin'] })
    const res = await invite(app, admin.auth, INVITEE)
    const oldToken = tokenIn((await delivered())[0])

    const resent = await request(app).post(`/api/admin/accounts/${res.body.id}/invitation`).set('Authorization', admin.auth)
    const messages = await delivered()
    const newToken = tokenIn(messages[1])

    expect(resent.status).toBe(200)
    expect(messages).toHaveLength(2)
    expect(newToken).not.toBe(oldToken)
    expect((await setPassword(app, oldToken)).body.error.code).toBe('invalid-link')
    expect((await setPassword(app, newToken)).status).toBe(200)
    expect(await AuditEventModel.count({ where: { action: 'invitation-sent', entityId: res.body.id } })).toBe(2)
  })

  it('refuses to resend to an account that already has a password', async () => {
    const { app } = await appWithMail()
    const admin = await makeCaller({ roles: ['admin'] })
    const person = await makeUser({ withPassword: true })

    const res = await request(app).post(`/api/admin/accounts/${person.id}/invitation`).set('Authorization', admin.auth)

    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('already-set-up')
  })

  it('refuses an address that already has an account, naming the field', async () => {
    const { app, delivered } = await appWithMail()
    const admin = await makeCaller({ roles: ['admin'] })
    await makeUser({ email: 'taken@saltmarsh.test', withPassword: false })

    const res = await invite(app, admin.auth, { ...INVITEE, email: 'TAKEN@saltmarsh.test' })

    expect(res.status).toBe(409)
    expect(res.body.error.fields).toEqual({ email: 'An account with this e-mail address already exists' })
    expect(await delivered()).toHaveLength(0)
  })

  it('answers bad input with field-level errors and creates nothing', async () => {
    const { app } = await appWithMail()
    const admin = await makeCaller({ roles: ['admin'] })
    const count = await UserModel.count()

    const res = await invite(app, admin.auth, { email: 'not-an-address', displayName: ' ', roles: [], teamIds: ['no-such-team'] })
    const badTeam = await invite(app, admin.auth, { ...INVITEE, teamIds: ['no-such-team'] })

    expect(res.status).toBe(400)
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['displayName', 'email', 'roles'])
    expect(badTeam.status).toBe(400)
    expect(badTeam.body.error.fields).toEqual({ teamIds: 'Choose teams from the list' })
    expect(await UserModel.count()).toBe(count)
  })

  it('is for admins only', async () => {
    const { app } = await appWithMail()
    const educator = await makeCaller({ roles: ['educator'] })

    const res = await invite(app, educator.auth, INVITEE)

    expect(res.status).toBe(403)
    expect(await UserModel.count({ where: { email: 'nadia.ferreira@saltmarsh.test' } })).toBe(0)
  })
})

describe('sendInvitation (used by the roster import)', () => {
  it('inside a transaction, sends only after the commit, and a rollback leaves neither a link nor a message', async () => {
    const { mailer, delivered } = await appWithMail()
    const admin = await makeUser({ roles: ['admin'], withPassword: false })
    const kept = await makeUser({ email: 'kept@saltmarsh.test', withPassword: false })
    const dropped = await makeUser({ email: 'dropped@saltmarsh.test', withPassword: false })

    await UserModel.sequelize!.transaction(async (transaction) => {
      await sendInvitation({ userId: kept.id, invitedBy: admin.id, mailer, baseUrl: BASE_URL, transaction })
    })
    await UserModel.sequelize!.transaction(async (transaction) => {
      await sendInvitation({ userId: dropped.id, invitedBy: admin.id, mailer, baseUrl: BASE_URL, transaction })
      throw new Error('roster import failed later')
    }).catch(() => undefined)
    const messages = await delivered()

    expect(messages.map((m) => m.to)).toEqual([['kept@saltmarsh.test']])
    expect(await AccountLinkModel.count({ where: { userId: dropped.id } })).toBe(0)
    expect(await AccountLinkModel.count({ where: { userId: kept.id } })).toBe(1)
  })
})
