import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { AuditEventModel, MembershipModel, RefreshSessionModel, UserModel } from '../../../server/models/index.ts'
import { makeCaller, makeTeam, makeTestApp, makeUser, signIn } from '../helpers.ts'

type App = Awaited<ReturnType<typeof makeTestApp>>['app']
let app: App

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

const asAdmin = (auth: string) => ({
  list: (query: Record<string, string> = {}) => request(app).get('/api/admin/accounts').query(query).set('Authorization', auth),
  patch: (id: string, body: Record<string, unknown>) => request(app).patch(`/api/admin/accounts/${id}`).set('Authorization', auth).send(body),
  deactivate: (id: string) => request(app).post(`/api/admin/accounts/${id}/deactivate`).set('Authorization', auth),
  reactivate: (id: string) => request(app).post(`/api/admin/accounts/${id}/reactivate`).set('Authorization', auth),
})

async function eventsOf(action: string, entityId: string) {
  const rows = await AuditEventModel.findAll({ where: { action, entityId } })
  return rows.map((r) => ({ actorId: r.actorId, changes: r.changes ? JSON.parse(r.changes) : null }))
}

describe('GET /api/admin/accounts', () => {
  it('searches name and e-mail without case, filters by role, team and state, and pages', async () => {
    const admin = await makeCaller({ roles: ['admin'], displayName: 'Morgan Reyes', email: 'admin@saltmarsh.test' })
    const icu = await makeTeam('Medical ICU')
    await makeUser({ displayName: 'Dr Mei Tanaka', email: 'mei@saltmarsh.test', roles: ['resident'], teamIds: [icu.id], withPassword: false })
    await makeUser({ displayName: 'Dr Noah Fitzgerald', email: 'noah@saltmarsh.test', roles: ['resident'], teamIds: [icu.id], active: false, withPassword: false })
    await makeUser({ displayName: 'Dr Priya Raman', email: 'priya@saltmarsh.test', roles: ['attending'], teamIds: [icu.id], withPassword: false })
    await makeUser({ displayName: 'Dr Hana Okafor', email: 'hana@saltmarsh.test', roles: ['educator'], withPassword: false })
    const api = asAdmin(admin.auth)

    const byName = await api.list({ search: 'TANAKA' })
    const byEmail = await api.list({ search: 'priya@' })
    const residents = await api.list({ role: 'resident' })
    const activeInIcu = await api.list({ teamId: icu.id, active: 'true' })
    const inactive = await api.list({ active: 'false' })
    const page2 = await api.list({ pageSize: '2', page: '2' })
    const wildcard = await api.list({ search: '%' })
    const underscore = await api.list({ search: 'mei_' })
    const escape = await api.list({ search: '!' })

    const names = (res: request.Response) => res.body.accounts.map((a: { displayName: string }) => a.displayName)
    expect(byName.status).toBe(200)
    expect(names(byName)).toEqual(['Dr Mei Tanaka'])
    expect(names(byEmail)).toEqual(['Dr Priya Raman'])
    expect(names(residents)).toEqual(['Dr Mei Tanaka', 'Dr Noah Fitzgerald'])
    expect(names(activeInIcu)).toEqual(['Dr Mei Tanaka', 'Dr Priya Raman'])
    expect(inactive.body.accounts).toMatchObject([{ displayName: 'Dr Noah Fitzgerald', status: 'deactivated', active: false }])
    expect(page2.body).toMatchObject({ total: 5, page: 2, pageSize: 2 })
    expect(names(page2)).toEqual(['Dr Noah Fitzgerald', 'Dr Priya Raman'])
    expect(byName.body.accounts[0]).toMatchObject({ status: 'invited', teams: [{ name: 'Medical ICU' }] })
    expect(wildcard.body.total).toBe(0)
    expect(underscore.body.total).toBe(0)
    expect(escape.body.total).toBe(0)
  })

  it('is for admins only and rejects an unknown filter value with a field error', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    const attending = await makeCaller({ roles: ['attending'] })

    const forbidden = await request(app).get('/api/admin/accounts').set('Authorization', attending.auth)
    const badRole = await asAdmin(admin.auth).list({ role: 'superuser' })

    expect(forbidden.status).toBe(403)
    expect(badRole.status).toBe(400)
    expect(Object.keys(badRole.body.error.fields)).toEqual(['role'])
  })
})

describe('PATCH /api/admin/accounts/:id', () => {
  it('changes roles, teams and the display name, each with its own audit event naming old and new', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    const ward = await makeTeam('Ward 7 North — Cardiology')
    const amu = await makeTeam('Acute Medical Unit')
    const person = await makeUser({ displayName: 'Dr Lewis Achebe', roles: ['resident'], teamIds: [ward.id], withPassword: false })

    const res = await asAdmin(admin.auth).patch(person.id, { roles: ['resident', 'attending'], teamIds: [amu.id], displayName: 'Dr Lewis A. Achebe' })

    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ displayName: 'Dr Lewis A. Achebe', roles: ['resident', 'attending'], teams: [{ id: amu.id }] })
    expect(await eventsOf('account-roles-changed', person.id)).toEqual([
      { actorId: admin.user.id, changes: { roles: { from: ['resident'], to: ['resident', 'attending'] } } },
    ])
    expect(await eventsOf('account-teams-changed', person.id)).toEqual([
      { actorId: admin.user.id, changes: { teamIds: { from: [ward.id], to: [amu.id] } } },
    ])
    expect(await eventsOf('account-renamed', person.id)).toEqual([
      { actorId: admin.user.id, changes: { displayName: { from: 'Dr Lewis Achebe', to: 'Dr Lewis A. Achebe' } } },
    ])
    expect(await MembershipModel.count({ where: { userId: person.id } })).toBe(1)
  })

  it('writes no event when nothing actually changes', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    const person = await makeUser({ roles: ['resident', 'attending'], withPassword: false })

    const res = await asAdmin(admin.auth).patch(person.id, { roles: ['attending', 'resident'], teamIds: [] })

    expect(res.status).toBe(200)
    expect(await AuditEventModel.count({ where: { entityId: person.id } })).toBe(0)
  })

  it('accepts only display name, roles and teams (mass assignment allowlist)', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    const person = await makeUser({ email: 'keep@saltmarsh.test', withPassword: false })

    const res = await asAdmin(admin.auth).patch(person.id, { email: 'other@saltmarsh.test', active: false })

    expect(res.status).toBe(400)
    expect((await UserModel.findByPk(person.id))!.email).toBe('keep@saltmarsh.test')
  })

  it('refuses to take the admin role from the last active admin, with a field error', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    await makeUser({ roles: ['admin'], active: false, withPassword: false })

    const res = await asAdmin(admin.auth).patch(admin.user.id, { roles: ['educator'] })

    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('last-admin')
    expect(Object.keys(res.body.error.fields)).toEqual(['roles'])
    expect((await UserModel.findByPk(admin.user.id))!.roles).toEqual(['admin'])
    expect(await AuditEventModel.count({ where: { action: 'account-roles-changed' } })).toBe(0)
  })

  it('lets an admin step down while another active admin remains', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    await makeUser({ roles: ['admin'], withPassword: false })

    const res = await asAdmin(admin.auth).patch(admin.user.id, { roles: ['educator'] })

    expect(res.status).toBe(200)
    expect(res.body.roles).toEqual(['educator'])
  })
})

describe('deactivation', () => {
  it('blocks sign-in, revokes every refresh session and stops the access token at once', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    const person = await makeUser({ email: 'leaver@saltmarsh.test' })
    const phone = await signIn(app, 'leaver@saltmarsh.test')
    const laptop = await signIn(app, 'leaver@saltmarsh.test')

    const res = await asAdmin(admin.auth).deactivate(person.id)
    const again = await signIn(app, 'leaver@saltmarsh.test')
    const refreshPhone = await request(app).post('/api/auth/refresh').set('Cookie', phone.cookie)
    const refreshLaptop = await request(app).post('/api/auth/refresh').set('Cookie', laptop.cookie)
    const me = await request(app).get('/api/me').set('Authorization', `Bearer ${laptop.token}`)

    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ active: false, status: 'deactivated' })
    expect(res.body.deactivatedAt).not.toBeNull()
    expect(again.res.status).toBe(401)
    expect(refreshPhone.status).toBe(401)
    expect(refreshLaptop.status).toBe(401)
    expect(me.status).toBe(401)
    expect(await RefreshSessionModel.count({ where: { userId: person.id, revokedAt: null } })).toBe(0)
    expect(await eventsOf('account-deactivated', person.id)).toEqual([{ actorId: admin.user.id, changes: { revokedSessions: 2 } }])
  })

  it('reactivation lets the account sign in again with its password', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    const person = await makeUser({ email: 'back@saltmarsh.test', active: false })

    const res = await asAdmin(admin.auth).reactivate(person.id)
    const signedIn = await signIn(app, 'back@saltmarsh.test')

    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ active: true, status: 'active', deactivatedAt: null })
    expect(signedIn.res.status).toBe(200)
    expect(await eventsOf('account-reactivated', person.id)).toEqual([{ actorId: admin.user.id, changes: null }])
  })

  it('an admin cannot deactivate their own account', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    await makeUser({ roles: ['admin'], withPassword: false })

    const res = await asAdmin(admin.auth).deactivate(admin.user.id)

    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('self-deactivation')
    expect((await UserModel.findByPk(admin.user.id))!.active).toBe(true)
  })

  it('is for admins only', async () => {
    const educator = await makeCaller({ roles: ['educator'] })
    const person = await makeUser({ withPassword: false })

    const res = await request(app).post(`/api/admin/accounts/${person.id}/deactivate`).set('Authorization', educator.auth)

    expect(res.status).toBe(403)
    expect((await UserModel.findByPk(person.id))!.active).toBe(true)
  })

  it('an unknown account answers 404', async () => {
    const admin = await makeCaller({ roles: ['admin'] })

    const res = await asAdmin(admin.auth).deactivate('no-such-id')

    expect(res.status).toBe(404)
  })
})
