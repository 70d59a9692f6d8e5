import { DataTypes, QueryTypes, type QueryInterface } from 'sequelize'
import { dropColumn } from '../columns.ts'
import { allowedValuesTrigger } from '../triggers.ts'

// The roles as they stand at this migration, written out so it runs the same whatever later code changes; also the
// order in which `down` writes them back into the JSON column.
const ROLES = ['resident', 'attending', 'educator', 'admin']

const select = <T extends object>(q: QueryInterface, sql: string) => q.sequelize.query<T>(sql, { type: QueryTypes.SELECT })

function parseRoles(userId: string, json: string): string[] {
  const roles: unknown = JSON.parse(json)
  if (!Array.isArray(roles) || !roles.every((r) => typeof r === 'string' && ROLES.includes(r))) {
    throw new Error(`users.roles of account ${userId} is ${json}; a role is one of ${ROLES.join(', ')}`)
  }
  return [...new Set<string>(roles)]
}

/** Roles move from a JSON text column on `users` to one row per account and role, which SQL can index and join. */
export async function up(q: QueryInterface): Promise<void> {
  // Read and checked first, so an account with an unknown role stops the migration before it changes anything.
  const users = await select<{ id: string; roles: string }>(q, 'SELECT "id", "roles" FROM "users"')
  const rows = users.flatMap((u) => parseRoles(u.id, u.roles).map((role) => ({ userId: u.id, role })))
  await q.createTable('user_roles', {
    userId: { type: DataTypes.STRING(36), primaryKey: true, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    role: { type: DataTypes.STRING(20), primaryKey: true },
  })
  // The primary key serves "roles of an account"; this index serves "accounts holding a role".
  await q.addIndex('user_roles', ['role'])
  const message = `a role is one of ${ROLES.join(', ')}`
  await allowedValuesTrigger(q, { name: 'user_roles_known_role', table: 'user_roles', column: 'role', values: ROLES, message })
  if (rows.length) await q.bulkInsert('user_roles', rows)
  await dropColumn(q, 'users', 'roles')
}

export async function down(q: QueryInterface): Promise<void> {
  await q.addColumn('users', 'roles', { type: DataTypes.TEXT, allowNull: false, defaultValue: '[]' })
  const rows = await select<{ userId: string; role: string }>(q, 'SELECT "userId", "role" FROM "user_roles"')
  const held = new Map<string, string[]>()
  for (const { userId, role } of rows) held.set(userId, [...(held.get(userId) ?? []), role])
  for (const [id, roles] of held) {
    const ordered = roles.sort((a, b) => ROLES.indexOf(a) - ROLES.indexOf(b))
    await q.bulkUpdate('users', { roles: JSON.stringify(ordered) }, { id })
  }
  await q.dropTable('user_roles')
}
