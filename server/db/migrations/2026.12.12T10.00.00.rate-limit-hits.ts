import { DataTypes, type QueryInterface } from 'sequelize'

/**
 * Attempt counters every app server shares (server/middleware/rate-limit-store.ts): one row per limiter and client,
 * its hits in the current window and when the window ends, in milliseconds since 1970 so both databases compare it
 * as a plain number.
 */
export async function up(q: QueryInterface): Promise<void> {
  await q.createTable('rate_limit_hits', {
    // SHA-256 in hex of the limiter and the client key: no address or e-mail is stored, and a long one fits.
    key: { type: DataTypes.STRING(64), primaryKey: true },
    hits: { type: DataTypes.INTEGER, allowNull: false },
    resetAt: { type: DataTypes.BIGINT, allowNull: false },
  })
  await q.addIndex('rate_limit_hits', ['resetAt'], { name: 'rate_limit_hits_reset_at' })
}

export async function down(q: QueryInterface): Promise<void> {
  await q.dropTable('rate_limit_hits')
}
