import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import { ExamModel } from '../models/index.ts'

/** One version of the settings; rows are only ever added (database triggers refuse changes and deletions). */
export class SettingsVersionModel extends Model<InferAttributes<SettingsVersionModel>, InferCreationAttributes<SettingsVersionModel>> {
  declare version: number
  /** The AppSettings as JSON. */
  declare values: string
  declare changedBy: string | null
  declare changedAt: Date
}

function init(sequelize: Sequelize): void {
  SettingsVersionModel.init(
    {
      version: { type: DataTypes.INTEGER, primaryKey: true },
      values: DataTypes.TEXT,
      changedBy: DataTypes.STRING(36),
      changedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'settings', timestamps: false },
  )
}

/**
 * The model, bound to the connection the exam model uses (here rather than in `initModels`, so this folder stays
 * self-contained); rebound when a test opens a new database.
 */
export function settingsVersions(): typeof SettingsVersionModel {
  const sequelize = ExamModel.sequelize
  if (!sequelize) throw new Error('The models are not bound to a database yet')
  if (SettingsVersionModel.sequelize !== sequelize) init(sequelize)
  return SettingsVersionModel
}
