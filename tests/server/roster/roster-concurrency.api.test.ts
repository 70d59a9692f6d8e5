import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { pino } from 'pino'
import type { Sequelize } from 'sequelize'
import { afterEach, describe, expect, it } from 'vitest'
import { createApp } from '../../../server/app.ts'
import { openDatabase } from '../../../server/db/sequelize.ts'
import { AccountLinkModel, initModels } from '../../../server/models/index.ts'
import { makeCaller, makeTeam, sharedTestDatabase, TEST_SECRET } from '../helpers.ts'
import { accountsSnapshot, fixture, SALTMARSH_TEAMS, upload } from './roster-helpers.ts'

let dir: string | undefined
let sequelize: Sequelize | undefined

afterEach(async () => {
  await sequelize?.close()
  if (dir) rmSync(dir, { recursive: true, force: true })
  dir = sequelize = undefined
})

/**
 * A database file, as in production: each transaction gets its own SQLite connection (an in-memory one is shared); on
 * PostgreSQL a database of its own.
 */
async function appOnFile() {
  dir = mkdtempSync(path.join(tmpdir(), 'plumbline-roster-'))
  sequelize = openDatabase(await sharedTestDatabase(dir))
  const models = initModels(sequelize)
  for (const name of SALTMARSH_TEAMS) await makeTeam(name)
  const deps = { sequelize, models, secret: TEST_SECRET, log: pino({ level: 'silent' }), demo: false, cookieSecure: false }
  return createApp({ ...deps, baseUrl: 'https://plumbline.test' })
}

describe('roster import: two admins applying the same file at the same moment', () => {
  it('creates each account once and issues each person one invitation', async () => {
    const app = await appOnFile()
    const admin = await makeCaller({ roles: ['admin'], email: 'admin@saltmarsh.test' })

    const [a, b] = await Promise.all([upload(app, admin.auth, 'apply', fixture('good.csv')), upload(app, admin.auth, 'apply', fixture('good.csv'))])

    expect([a.status, b.status]).toEqual([200, 200])
    expect([a.body.created, b.body.created].sort()).toEqual([0, 4])
    expect((await accountsSnapshot()).map((x) => x.email)).toEqual([
      'admin@saltmarsh.test',
      'hannah.kowalczyk@saltmarsh.test',
      'marta.lindgren@saltmarsh.test',
      'oluwaseun.adebayo@saltmarsh.test',
      'priya.raman@saltmarsh.test',
    ])
    expect(await AccountLinkModel.count({ where: { purpose: 'invitation' } })).toBe(4)
  })
})
