import { beforeEach, describe, expect, it } from 'vitest'
import { AuditEventModel } from '../../../server/models/index.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { DAY, MINUTE, pairsAs, storeExam } from './factories.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

const T0 = Date.now() - 30 * DAY

async function threePairs() {
  const team = await makeTeam('Ward 7 North')
  const resident = await makeCaller({ roles: ['resident'], teamIds: [team.id] })
  const attending = await makeCaller({ roles: ['attending'], teamIds: [team.id] })
  for (let i = 0; i < 3; i++) {
    const common = { teamId: team.id, patientCode: `SM-${3000 + i}`, findings: { inclinationDeg: 45 } }
    await storeExam({ ...common, examinerId: resident.user.id, at: T0 + i * DAY })
    await storeExam({ ...common, examinerId: attending.user.id, at: T0 + i * DAY + 20 * MINUTE })
  }
  return { team, educator: await makeCaller({ roles: ['educator'] }) }
}

const exportsBy = (actorId: string) => AuditEventModel.findAll({ where: { action: 'agreement-pairs-export', actorId }, order: [['id', 'ASC']] })

describe('GET /api/agreement/pairs?export=csv: the pairs download is audited', () => {
  it('records one export with the filters and the number of pairs, on the first page only', async () => {
    const { team, educator } = await threePairs()
    const filters = { teamId: team.id, inclinationBand: '30-59', vein: 'internal' }

    await pairsAs(app, educator.auth, { ...filters, export: 'csv', page: 1, pageSize: 2 })
    await pairsAs(app, educator.auth, { ...filters, export: 'csv', page: 2, pageSize: 2 })

    const events = await exportsBy(educator.user.id)
    expect(events).toHaveLength(1)
    expect(events[0]!.entityType).toBe('export')
    expect(JSON.parse(events[0]!.changes!)).toEqual({ format: 'csv', filter: filters, rows: 3 })
  })

  it('records nothing for the dashboard’s ordinary reads', async () => {
    const { educator } = await threePairs()

    await pairsAs(app, educator.auth, { page: 1, pageSize: 1000 })

    expect(await exportsBy(educator.user.id)).toHaveLength(0)
  })

  it('refuses an export format it does not write', async () => {
    const { educator } = await threePairs()

    const { res } = await pairsAs(app, educator.auth, { export: 'xlsx' })

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toHaveProperty('export')
  })
})
