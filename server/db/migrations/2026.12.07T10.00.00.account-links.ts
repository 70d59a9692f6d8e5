import { DataTypes, type QueryInterface } from 'sequelize'

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
  await q.sequelize.query(
    `CREATE TRIGGER account_links_purpose BEFORE INSERT ON account_links WHEN NEW.purpose NOT IN ('invitation', 'reset')
     BEGIN SELECT RAISE(ABORT, 'account link purpose must be invitation or reset'); END`,
  )
  await q.addColumn('users', 'invitedAt', { type: DataTypes.DATE, allowNull: true })
  await q.addColumn('users', 'deactivatedAt', { type: DataTypes.DATE, allowNull: true })
  await q.addColumn('users', 'passwordChangedAt', { type: DataTypes.DATE, allowNull: true })
}

export async function down(q: QueryInterface): Promise<void> {
  await q.removeColumn('users', 'passwordChangedAt')
  await q.removeColumn('users', 'deactivatedAt')
  await q.removeColumn('users', 'invitedAt')
  await q.sequelize.query('DROP TRIGGER IF EXISTS account_links_purpose')
  await q.dropTable('account_links')
}
