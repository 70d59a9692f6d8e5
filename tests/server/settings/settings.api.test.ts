import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { DEFAULT_APP_SETTINGS, SettingsHistorySchema, SettingsVersionSchema } from '#shared/schemas/settings'
import { AuditEventModel } from '../../../server/models/index.ts'
import { makeCaller, makeTestApp } from '../helpers.ts'
import { putSettings, saveSettings, settingsWith } from './settings-calls.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

describe('GET /api/settings', () => {
  it('answers version 1 holding the defaults: cited thresholds and the pairing window', async () => {
    const { auth } = await makeCaller({ roles: ['resident'] })

    const res = await request(app).get('/api/settings').set('Authorization', auth)

    expect(res.status).toBe(200)
    const settings = SettingsVersionSchema.parse(res.body)
    expect(settings.version).toBe(1)
    expect(settings.values).toEqual(DEFAULT_APP_SETTINGS)
    // McGee 1998: elevated above 3 cm; Cook 1990 categories: low < 5, high > 10 cmH₂O; the 120-minute pairing window
    // is a product default, no published source.
    expect(settings.values.estimate).toMatchObject({ elevatedAboveCm: 3, lowBelowCmH2O: 5, highAboveCmH2O: 10 })
    expect(settings.values.pairWindowMinutes).toBe(120)
    expect(settings.values.photosAllowed).toBe(false)
  })

  it('is readable by every role, and not without a session', async () => {
    const callers = await Promise.all((['resident', 'attending', 'educator', 'admin'] as const).map((role) => makeCaller({ roles: [role] })))

    const answers = await Promise.all(callers.map(({ auth }) => request(app).get('/api/settings').set('Authorization', auth)))
    const anonymous = await request(app).get('/api/settings')

    expect(answers.map((r) => r.status)).toEqual([200, 200, 200, 200])
    expect(anonymous.status).toBe(401)
  })

  it('answers an older version by number, and 404 for one that does not exist', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    const resident = await makeCaller({ roles: ['resident'] })
    await saveSettings(app, admin.auth, { estimate: { highAboveCmH2O: 12 } })

    const first = await request(app).get('/api/settings/versions/1').set('Authorization', resident.auth)
    const missing = await request(app).get('/api/settings/versions/9').set('Authorization', resident.auth)

    expect(first.status).toBe(200)
    expect(first.body.values.estimate.highAboveCmH2O).toBe(10)
    expect(missing.status).toBe(404)
  })
})

describe('PUT /api/admin/settings', () => {
  it('saves the change as a new version that everyone then reads', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    const resident = await makeCaller({ roles: ['resident'] })

    const res = await putSettings(app, admin.auth, { ...settingsWith({ pairWindowMinutes: 90, photosAllowed: true }), baseVersion: 1 })

    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ version: 2, values: { pairWindowMinutes: 90, photosAllowed: true } })
    const read = await request(app).get('/api/settings').set('Authorization', resident.auth)
    expect(read.body).toMatchObject({ version: 2, values: { pairWindowMinutes: 90, photosAllowed: true } })
  })

  it('answers 403 to every role but admin and stores nothing', async () => {
    const callers = await Promise.all((['resident', 'attending', 'educator'] as const).map((role) => makeCaller({ roles: [role] })))
    const body = { ...settingsWith({ pairWindowMinutes: 90 }), baseVersion: 1 }

    const answers = await Promise.all(callers.map(({ auth }) => putSettings(app, auth, body)))

    expect(answers.map((r) => r.status)).toEqual([403, 403, 403])
    const read = await request(app).get('/api/settings').set('Authorization', callers[0]!.auth)
    expect(read.body.version).toBe(1)
  })

  it('when the low-CVP threshold is not below the high one, answers 400 naming both fields and keeps the version', async () => {
    const admin = await makeCaller({ roles: ['admin'] })

    const res = await putSettings(app, admin.auth, { ...settingsWith({ estimate: { lowBelowCmH2O: 12, highAboveCmH2O: 10 } }), baseVersion: 1 })

    expect(res.status).toBe(400)
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['estimate.highAboveCmH2O', 'estimate.lowBelowCmH2O'])
    expect(res.body.error.fields['estimate.lowBelowCmH2O']).toContain('below the high-CVP threshold')
    const read = await request(app).get('/api/settings').set('Authorization', admin.auth)
    expect(read.body.version).toBe(1)
  })

  it('names each out-of-range or missing value by its path', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    const { photosAllowed: _omitted, ...withoutPhotos } = settingsWith({ pairWindowMinutes: 10, estimate: { sigmaObserverCm: 0 } })

    const res = await putSettings(app, admin.auth, { ...withoutPhotos, baseVersion: 1 })

    expect(res.status).toBe(400)
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['estimate.sigmaObserverCm', 'pairWindowMinutes', 'photosAllowed'])
    expect(res.body.error.fields.pairWindowMinutes).toBe('The pairing window is at least 15 minutes')
  })

  it('when based on an older version, answers 409 with the newer settings and stores nothing', async () => {
    const first = await makeCaller({ roles: ['admin'] })
    const second = await makeCaller({ roles: ['admin'] })
    await saveSettings(app, first.auth, { pairWindowMinutes: 90 })

    const res = await putSettings(app, second.auth, { ...settingsWith({ pairWindowMinutes: 60 }), baseVersion: 1 })

    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('stale-settings')
    expect(res.body.settings).toMatchObject({ version: 2, values: { pairWindowMinutes: 90 } })
    const read = await request(app).get('/api/settings').set('Authorization', second.auth)
    expect(read.body).toMatchObject({ version: 2, values: { pairWindowMinutes: 90 } })
  })

  it('audits the save with the admin, the new version and the before/after of each changed value only', async () => {
    const admin = await makeCaller({ roles: ['admin'] })

    await saveSettings(app, admin.auth, { estimate: { highAboveCmH2O: 12 }, defaultOffsetModel: 'fixed-5cm' })

    const events = await AuditEventModel.findAll({ where: { action: 'settings-update' } })
    expect(events).toHaveLength(1)
    expect(events[0]).toMatchObject({ actorId: admin.user.id, entityType: 'settings', entityId: '2' })
    expect(JSON.parse(events[0]!.changes!)).toEqual({
      'estimate.highAboveCmH2O': { from: 10, to: 12 },
      defaultOffsetModel: { from: 'incline-adjusted', to: 'fixed-5cm' },
      version: { from: 1, to: 2 },
    })
  })

  it('a save that changes nothing adds no version and no audit event', async () => {
    const admin = await makeCaller({ roles: ['admin'] })

    const res = await putSettings(app, admin.auth, { ...settingsWith(), baseVersion: 1 })

    expect(res.status).toBe(200)
    expect(res.body.version).toBe(1)
    expect(await AuditEventModel.count({ where: { action: 'settings-update' } })).toBe(0)
  })
})

describe('the settings history in the database', () => {
  it('refuses to change or delete a stored version', async () => {
    const { sequelize } = await makeTestApp()

    const update = await sequelize.query(`UPDATE settings SET "values" = '{}' WHERE version = 1`).catch((e: { parent?: Error }) => e.parent)
    const remove = await sequelize.query('DELETE FROM settings WHERE version = 1').catch((e: { parent?: Error }) => e.parent)

    expect(String(update)).toContain('settings versions are append-only')
    expect(String(remove)).toContain('settings versions are append-only')
  })
})

describe('GET /api/admin/settings/history', () => {
  it('lists the versions newest first with who saved each and what it changed', async () => {
    const admin = await makeCaller({ roles: ['admin'], displayName: 'Morgan Hale' })
    await saveSettings(app, admin.auth, { pairWindowMinutes: 90 })
    await saveSettings(app, admin.auth, { pairWindowMinutes: 90, estimate: { elevatedAboveCm: 4 } })

    const res = await request(app).get('/api/admin/settings/history').set('Authorization', admin.auth)

    expect(res.status).toBe(200)
    const { versions } = SettingsHistorySchema.parse(res.body)
    expect(versions.map((v) => v.version)).toEqual([3, 2, 1])
    expect(versions[0]).toMatchObject({ changedBy: { id: admin.user.id, displayName: 'Morgan Hale' }, changes: { 'estimate.elevatedAboveCm': { from: 3, to: 4 } } })
    expect(Object.keys(versions[0]!.changes)).toEqual(['estimate.elevatedAboveCm'])
    expect(versions[1]!.changes).toEqual({ pairWindowMinutes: { from: 120, to: 90 } })
    expect(versions[2]).toMatchObject({ version: 1, changedBy: null, changes: {} })
  })

  it('answers 403 to a clinician', async () => {
    const { auth } = await makeCaller({ roles: ['educator'] })

    const res = await request(app).get('/api/admin/settings/history').set('Authorization', auth)

    expect(res.status).toBe(403)
  })
})
