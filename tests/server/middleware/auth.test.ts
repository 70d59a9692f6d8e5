import { randomUUID } from 'node:crypto'
import request from 'supertest'
import type { Sequelize } from 'sequelize'
import { beforeEach, describe, expect, it } from 'vitest'
import { UserSchema } from '#shared/schemas/user'
import { signAccessToken } from '../../../server/auth/tokens.ts'
import { MembershipModel, UserModel } from '../../../server/models/index.ts'
import { makeCaller, makeTeam, makeTestApp, TEST_SECRET } from '../helpers.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']
let sequelize: Sequelize

beforeEach(async () => {
  ;({ app, sequelize } = await makeTestApp())
})

const me = (auth: string) => request(app).get('/api/me').set('Authorization', auth)
const asAdmin = (auth: string) => ({
  patch: (id: string, body: object) => request(app).patch(`/api/admin/accounts/${id}`).set('Authorization', auth).send(body),
  deactivate: (id: string) => request(app).post(`/api/admin/accounts/${id}/deactivate`).set('Authorization', auth),
})

describe('requireAuth: the account as stored at each request', () => {
  it('answers the account with its roles in the schema’s order and every team it belongs to, by team id', async () => {
    const [icu, amu] = [await makeTeam('Intensive Care'), await makeTeam('Acute Medical Unit')]
    const caller = await makeCaller({ roles: ['educator', 'attending'], teamIds: [icu.id, amu.id], displayName: 'Dr Ines Duarte' })

    const res = await me(caller.auth)

    expect(res.status).toBe(200)
    const user = UserSchema.parse(res.body)
    expect(user).toMatchObject({ id: caller.user.id, email: caller.user.email, displayName: 'Dr Ines Duarte', active: true })
    expect(user.roles).toEqual(['attending', 'educator'])
    const byId = [icu, amu].sort((a, b) => (a.id < b.id ? -1 : 1)).map((t) => ({ id: t.id, name: t.name }))
    expect(user.teams).toEqual(byId)
  })

  it('when the account is deactivated, refuses its still-valid token on the very next request', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    const caller = await makeCaller()
    expect((await me(caller.auth)).status).toBe(200)

    expect((await asAdmin(admin.auth).deactivate(caller.user.id)).status).toBe(200)

    const res = await me(caller.auth)
    expect(res.status).toBe(401)
    expect(res.body.error.code).toBe('invalid-token')
  })

  it('when an attending’s role is removed, refuses the sign-off queue on the very next request', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    const team = await makeTeam()
    const caller = await makeCaller({ roles: ['attending', 'resident'], teamIds: [team.id] })
    const queue = () => request(app).get('/api/signoff-queue').set('Authorization', caller.auth)
    expect((await queue()).status).toBe(200)

    expect((await asAdmin(admin.auth).patch(caller.user.id, { roles: ['resident'], teamIds: [team.id] })).status).toBe(200)

    expect((await queue()).status).toBe(403)
  })

  it('when a role or a team is removed by SQL behind the application’s back, the next request already goes without it', async () => {
    const team = await makeTeam()
    const caller = await makeCaller({ roles: ['attending', 'resident'], teamIds: [team.id] })
    expect(UserSchema.parse((await me(caller.auth)).body)).toMatchObject({ roles: ['resident', 'attending'], teams: [{ id: team.id }] })

    await sequelize.query(`DELETE FROM "user_roles" WHERE "userId" = :id AND "role" = 'attending'`, {
      replacements: { id: caller.user.id },
    })
    await MembershipModel.destroy({ where: { userId: caller.user.id } })

    expect(UserSchema.parse((await me(caller.auth)).body)).toMatchObject({ roles: ['resident'], teams: [] })
  })

  it('when the token names no stored account, responds 401', async () => {
    const token = signAccessToken(TEST_SECRET, { sub: randomUUID(), roles: ['admin'] })

    const res = await me(`Bearer ${token}`)

    expect(res.status).toBe(401)
    expect(res.body.error.code).toBe('invalid-token')
  })

  it('when the password changed after the token was issued, refuses the token', async () => {
    const caller = await makeCaller()
    expect((await me(caller.auth)).status).toBe(200)

    await UserModel.update({ passwordChangedAt: new Date(Date.now() + 60_000) }, { where: { id: caller.user.id } })

    expect((await me(caller.auth)).status).toBe(401)
  })
})
