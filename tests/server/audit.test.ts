import { beforeEach, describe, expect, it } from 'vitest'
import type { Sequelize } from 'sequelize'
import { audit } from '../../server/audit.ts'
import { AuditEventModel } from '../../server/models/index.ts'
import { makeTestApp } from './helpers.ts'

let sequelize: Sequelize

async function failureOf(sql: string): Promise<string> {
  try {
    await sequelize.query(sql)
    return 'no error'
  } catch (e) {
    const err = e as { original?: Error; message: string }
    return err.original?.message ?? err.message
  }
}

beforeEach(async () => {
  ;({ sequelize } = await makeTestApp())
})

describe('audit trail', () => {
  it('keeps appended events', async () => {
    await audit({ actorId: null, action: 'login-failed', changes: { reason: 'test' } })

    const rows = await AuditEventModel.findAll()

    expect(rows).toHaveLength(1)
    expect(JSON.parse(rows[0]!.changes!)).toEqual({ reason: 'test' })
  })

  it('refuses UPDATE of a row at the database level', async () => {
    await audit({ actorId: null, action: 'login' })

    expect(await failureOf(`UPDATE audit_events SET action = 'tampered'`)).toMatch(/append-only/)
    expect((await AuditEventModel.findOne())!.action).toBe('login')
  })

  it('refuses DELETE of a row at the database level', async () => {
    await audit({ actorId: null, action: 'login' })

    expect(await failureOf(`DELETE FROM audit_events`)).toMatch(/append-only/)
    expect(await AuditEventModel.count()).toBe(1)
  })
})
