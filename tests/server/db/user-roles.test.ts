import { QueryTypes, type Sequelize } from 'sequelize'
import { openBlankDatabase } from '../helpers.ts'
import { columnNames, tableNames } from './schema-snapshot.ts'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { createMigrator, migrationNames } from '../../../server/db/migrator.ts'
import { initModels, UserModel, UserRoleModel, withRole } from '../../../server/models/index.ts'

const USER_ROLES = '2026.12.08T10.00.00.user-roles'

let db: Sequelize
beforeEach(async () => {
  db = await openBlankDatabase()
})
afterEach(() => db.close())

const select = <T extends object>(sql: string) => db.query<T>(sql, { type: QueryTypes.SELECT })

async function insertUser(id: string, roles: string): Promise<void> {
  await db.query(
    `INSERT INTO "users" ("id", "email", "displayName", "roles", "createdAt", "updatedAt") VALUES (?, ?, ?, ?, '2026-12-08', '2026-12-08')`,
    { replacements: [id, `${id}@ward.test`, id, roles] },
  )
}

async function migratedBeforeUserRoles() {
  const migrator = createMigrator(db)
  await migrator.up({ to: migrationNames[migrationNames.indexOf(USER_ROLES) - 1]! })
  return migrator
}

describe(`migration ${USER_ROLES}`, () => {
  it('moves each account’s roles into one row per role and drops the JSON column; down writes them back in role order', async () => {
    const migrator = await migratedBeforeUserRoles()
    await insertUser('both', '["attending","resident","attending"]')
    await insertUser('none', '[]')

    await migrator.up({ to: USER_ROLES })
    const rows = await select(`SELECT "userId", "role" FROM "user_roles" ORDER BY "userId", "role"`)
    const columns = await columnNames(db, 'users')
    await migrator.down({ to: USER_ROLES })

    expect(rows).toEqual([
      { userId: 'both', role: 'attending' },
      { userId: 'both', role: 'resident' },
    ])
    expect(columns).not.toContain('roles')
    expect(await select(`SELECT "id", "roles" FROM "users" ORDER BY "id"`)).toEqual([
      { id: 'both', roles: '["resident","attending"]' },
      { id: 'none', roles: '[]' },
    ])
  })

  it('refuses a role outside the four, naming the account, and leaves the schema as it was', async () => {
    const migrator = await migratedBeforeUserRoles()
    await insertUser('odd', '["superuser"]')

    const failure = await migrator.up({ to: USER_ROLES }).catch((error: Error) => error)

    expect(String((failure as Error).cause)).toContain('users.roles of account odd is ["superuser"]; a role is one of resident')
    expect(await select(`SELECT "roles" FROM "users"`)).toEqual([{ roles: '["superuser"]' }])
    expect(await tableNames(db)).not.toContain('user_roles')
  })
})

describe('UserModel.roles', () => {
  beforeEach(async () => {
    initModels(db)
    await createMigrator(db).up()
  })

  const make = (id: string, roles: UserModel['roles']) =>
    UserModel.create({ id, email: `${id}@ward.test`, displayName: id, passwordHash: null, roles })

  it('are written to user_roles on create and read back in role order', async () => {
    await make('a', ['admin', 'attending'])

    expect(await UserRoleModel.count({ where: { userId: 'a' } })).toBe(2)
    expect((await UserModel.findByPk('a'))!.roles).toEqual(['attending', 'admin'])
  })

  it('are replaced when a changed list is saved, and left alone by a save of other fields', async () => {
    await make('a', ['resident'])
    const user = (await UserModel.findByPk('a'))!

    user.roles = ['attending']
    await user.save()
    await user.update({ displayName: 'Renamed' })

    expect((await UserRoleModel.findAll({ where: { userId: 'a' } })).map((r) => r.role)).toEqual(['attending'])
  })

  it('are written for every account of a bulk create, and found through withRole', async () => {
    const base = (id: string) => ({ id, email: `${id}@ward.test`, displayName: id, passwordHash: null })
    await UserModel.bulkCreate([
      { ...base('r'), roles: ['resident'] },
      { ...base('e'), roles: ['educator', 'resident'] },
    ])

    const residents = await UserModel.findAll({ where: withRole('resident'), order: [['id', 'ASC']] })

    expect(residents.map((u) => [u.id, u.roles])).toEqual([
      ['e', ['resident', 'educator']],
      ['r', ['resident']],
    ])
  })

  it('hold only the four roles, whatever writes the row', async () => {
    await make('a', ['resident'])

    const failure: unknown = await UserRoleModel.create({ userId: 'a', role: 'nurse' as never }).catch((error: unknown) => error)

    expect((failure as { original: Error }).original.message).toContain('a role is one of resident, attending, educator, admin')
  })

  it('cannot change through UserModel.update, which would silently skip them', async () => {
    await make('a', ['resident'])

    await expect(UserModel.update({ roles: ['admin'] }, { where: { id: 'a' } })).rejects.toThrow(/saved UserModel/)
  })
})
