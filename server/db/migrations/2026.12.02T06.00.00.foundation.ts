import { DataTypes, type QueryInterface } from 'sequelize'
import { appendOnlyTriggers } from '../triggers.ts'

const stamps = {
  createdAt: { type: DataTypes.DATE, allowNull: false },
  updatedAt: { type: DataTypes.DATE, allowNull: false },
}

export async function up(q: QueryInterface): Promise<void> {
  await q.createTable('users', {
    id: { type: DataTypes.STRING(36), primaryKey: true },
    email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
    displayName: { type: DataTypes.STRING(120), allowNull: false },
    passwordHash: { type: DataTypes.STRING(100), allowNull: true },
    roles: { type: DataTypes.TEXT, allowNull: false, defaultValue: '[]' },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    ...stamps,
  })
  await q.createTable('teams', {
    id: { type: DataTypes.STRING(36), primaryKey: true },
    name: { type: DataTypes.STRING(120), allowNull: false, unique: true },
    ...stamps,
  })
  await q.createTable('team_memberships', {
    userId: { type: DataTypes.STRING(36), primaryKey: true, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    teamId: { type: DataTypes.STRING(36), primaryKey: true, references: { model: 'teams', key: 'id' }, onDelete: 'CASCADE' },
    ...stamps,
  })
  await q.createTable('refresh_sessions', {
    id: { type: DataTypes.STRING(36), primaryKey: true },
    userId: { type: DataTypes.STRING(36), allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    familyId: { type: DataTypes.STRING(36), allowNull: false },
    tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    revokedAt: { type: DataTypes.DATE, allowNull: true },
    ...stamps,
  })
  await q.addIndex('refresh_sessions', ['familyId'])
  await q.createTable('audit_events', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    at: { type: DataTypes.DATE, allowNull: false },
    actorId: { type: DataTypes.STRING(36), allowNull: true },
    action: { type: DataTypes.STRING(60), allowNull: false },
    entityType: { type: DataTypes.STRING(40), allowNull: true },
    entityId: { type: DataTypes.STRING(64), allowNull: true },
    changes: { type: DataTypes.TEXT, allowNull: true },
  })
  await q.addIndex('audit_events', ['entityType', 'entityId'])
  // 21 CFR 11.10(e): the trail is append-only, enforced by the database itself.
  await appendOnlyTriggers(q, 'audit_events', 'audit trail is append-only')
}

export async function down(q: QueryInterface): Promise<void> {
  await q.dropTable('audit_events')
  await q.dropTable('refresh_sessions')
  await q.dropTable('team_memberships')
  await q.dropTable('teams')
  await q.dropTable('users')
}
