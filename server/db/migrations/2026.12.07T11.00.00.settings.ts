import { DataTypes, type QueryInterface } from 'sequelize'
import { appendOnlyTriggers } from '../triggers.ts'

// The defaults (cited in README, Clinical rules) as they stood when settings became editable, written out here so this
// migration seeds the same version 1 whatever later code changes; tests/server/settings checks them against the schema.
const VERSION_1 = {
  estimate: {
    elevatedAboveCm: 3,
    lowBelowCmH2O: 5,
    highAboveCmH2O: 10,
    sigmaReadRulerCm: 0.5,
    sigmaReadVisualCm: 1.5,
    sigmaOffsetCm: 1,
    sigmaOffsetOutsideRangeCm: 2,
    sigmaObserverCm: 2,
    minVenousSigns: 3,
  },
  pairWindowMinutes: 120,
  defaultOffsetModel: 'incline-adjusted',
  photosAllowed: false,
}

export async function up(q: QueryInterface): Promise<void> {
  // One row per version, never changed: the newest is in force, the older ones say what past estimates used.
  await q.createTable('settings', {
    version: { type: DataTypes.INTEGER, primaryKey: true },
    values: { type: DataTypes.TEXT, allowNull: false },
    // No foreign key: the history outlives the account that wrote it. Null for the seeded defaults.
    changedBy: { type: DataTypes.STRING(36), allowNull: true },
    changedAt: { type: DataTypes.DATE, allowNull: false },
  })
  await appendOnlyTriggers(q, 'settings', 'settings versions are append-only')
  await q.bulkInsert('settings', [{ version: 1, values: JSON.stringify(VERSION_1), changedBy: null, changedAt: new Date() }])
}

export async function down(q: QueryInterface): Promise<void> {
  await q.dropTable('settings')
}
