import { DataTypes, type QueryInterface } from 'sequelize'
import { dropColumn } from '../columns.ts'
import { allowedValuesTrigger } from '../triggers.ts'

/**
 * One-time links for invitations and password resets, and the account dates the admin screen shows.
 * Only the SHA-256 of a link's token is stored: a copy of the database cannot be turned into working links.
 */
export async function up(q: QueryInterface): Promise<void> {
  await q.createTable('account_links', {
    id: { type: DataTypes.STRING(36), primaryKey: true },
    userId: { type: DataTypes.STRING(36), allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    purpose: { type: DataTypes.STRING(20), allowNull: false },
    tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    usedAt: { type: DataTypes.DATE, allowNull: true },
    /** The admin who sent the invitation; null for a reset the account holder asked for. */
    createdBy: { type: DataTypes.STRING(36), allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    updatedAt: { type: DataTypes.DATE, allowNull: false },
  })
  await q.addIndex('account_links', ['userId', 'purpose'])
  await allowedValuesTrigger(q, {
    name: 'account_links_purpose',
    table: 'account_links',
    column: 'purpose',
    values: ['invitation', 'reset'],
    message: 'account link purpose must be invitation or reset',
  })
  await q.addColumn('users', 'invitedAt', { type: DataTypes.DATE, allowNull: true })
  await q.addColumn('users', 'deactivatedAt', { type: DataTypes.DATE, allowNull: true })
  await q.addColumn('users', 'passwordChangedAt', { type: DataTypes.DATE, allowNull: true })
}

export async function down(q: QueryInterface): Promise<void> {
  await dropColumn(q, 'users', 'passwordChangedAt')
  await dropColumn(q, 'users', 'deactivatedAt')
  await dropColumn(q, 'users', 'invitedAt')
  await q.dropTable('account_links')
}
