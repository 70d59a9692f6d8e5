import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

/** One version of the settings; rows are only ever added (database triggers refuse changes and deletions). */
export class SettingsVersionModel extends Model<InferAttributes<SettingsVersionModel>, InferCreationAttributes<SettingsVersionModel>> {
  declare version: number
  /** The AppSettings as JSON. */
  declare values: string
  declare changedBy: string | null
  declare changedAt: Date
}

export function initSettingsVersionModel(sequelize: Sequelize): void {
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
