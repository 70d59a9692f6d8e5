import {
  DataTypes,
  literal,
  Model,
  Op,
  type CreationOptional,
  type FindOptions,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
  type Transaction,
  type WhereOptions,
} from 'sequelize'
import { RoleSchema, type Role } from '#shared/schemas/user'

export class UserModel extends Model<InferAttributes<UserModel>, InferCreationAttributes<UserModel>> {
  declare id: string
  declare email: string
  declare displayName: string
  declare passwordHash: string | null
  /** Rows of `user_roles`, read with the account (in RoleSchema's order) and written when it is created or saved. */
  declare roles: Role[]
  declare active: CreationOptional<boolean>
  declare invitedAt: CreationOptional<Date | null>
  declare deactivatedAt: CreationOptional<Date | null>
  declare passwordChangedAt: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class UserRoleModel extends Model<InferAttributes<UserRoleModel>, InferCreationAttributes<UserRoleModel>> {
  declare userId: string
  declare role: Role
}

const ORDER = RoleSchema.options

async function loadRoles(users: UserModel[], transaction?: Transaction | null): Promise<void> {
  const rows = await UserRoleModel.findAll({ where: { userId: { [Op.in]: users.map((u) => u.id) } }, transaction })
  const held = new Map<string, Set<Role>>()
  for (const r of rows) held.set(r.userId, (held.get(r.userId) ?? new Set()).add(RoleSchema.parse(r.role)))
  // raw: loading is not a change, so a later save writes the roles only if someone changed them.
  for (const u of users) u.set('roles', ORDER.filter((role) => held.get(u.id)?.has(role)), { raw: true })
}

async function saveRoles(users: readonly UserModel[], transaction: Transaction | null | undefined, replace: boolean): Promise<void> {
  if (replace) await UserRoleModel.destroy({ where: { userId: { [Op.in]: users.map((u) => u.id) } }, transaction })
  const rows = users.flatMap((u) => [...new Set(u.roles ?? [])].map((role) => ({ userId: u.id, role })))
  await UserRoleModel.bulkCreate(rows, { transaction })
}

// Sequelize drops virtual attributes from `attributes` before the query; the list as asked for stays here.
const asksForRoles = (options: FindOptions) => {
  const asked = (options as { originalAttributes?: unknown[] }).originalAttributes
  return !asked || asked.includes('roles')
}

const foundUsers = (found: unknown): UserModel[] =>
  (Array.isArray(found) ? found : [found]).filter((u): u is UserModel => u instanceof UserModel && u.id !== undefined)

/** Binds the account models; the roles live in their own table and reach `UserModel.roles` through these hooks. */
export function initUserModels(sequelize: Sequelize): void {
  UserModel.init(
    {
      id: { type: DataTypes.STRING(36), primaryKey: true },
      email: DataTypes.STRING,
      displayName: DataTypes.STRING,
      passwordHash: DataTypes.STRING,
      roles: DataTypes.VIRTUAL,
      active: DataTypes.BOOLEAN,
      invitedAt: DataTypes.DATE,
      deactivatedAt: DataTypes.DATE,
      passwordChangedAt: DataTypes.DATE,
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    {
      sequelize,
      tableName: 'users',
      hooks: {
        afterFind: async (found, options) => {
          const users = foundUsers(found)
          if (users.length && asksForRoles(options)) await loadRoles(users, options.transaction)
        },
        afterCreate: (user, options) => saveRoles([user], options.transaction, false),
        afterBulkCreate: (users, options) => saveRoles(users, options.transaction, false),
        afterUpdate: async (user, options) => {
          if (options.fields?.includes('roles')) await saveRoles([user], options.transaction, true)
        },
        beforeBulkUpdate: (options) => {
          if (options.fields?.includes('roles')) throw new Error('Roles change through a saved UserModel, not UserModel.update')
        },
      },
    },
  )
  UserRoleModel.init(
    { userId: { type: DataTypes.STRING(36), primaryKey: true }, role: { type: DataTypes.STRING(20), primaryKey: true } },
    { sequelize, tableName: 'user_roles', timestamps: false },
  )
}

/** Where-clause on `users`: the account holds the role. */
export function withRole(role: Role): WhereOptions<UserModel> {
  const sql = `(SELECT "userId" FROM "user_roles" WHERE "role" = ${UserRoleModel.sequelize!.escape(role)})`
  return { id: { [Op.in]: literal(sql) } }
}
