import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize'

export type AccountLinkPurpose = 'invitation' | 'reset'

/** A one-time link to set a password; only the SHA-256 of its token is kept. */
export class AccountLinkModel extends Model<InferAttributes<AccountLinkModel>, InferCreationAttributes<AccountLinkModel>> {
  declare id: string
  declare userId: string
  declare purpose: AccountLinkPurpose
  declare tokenHash: string
  declare expiresAt: Date
  declare usedAt: Date | null
  declare createdBy: string | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export function initAccountLinkModel(sequelize: Sequelize): void {
  AccountLinkModel.init(
    {
      id: { type: DataTypes.STRING(36), primaryKey: true },
      userId: DataTypes.STRING,
      purpose: DataTypes.STRING,
      tokenHash: DataTypes.STRING,
      expiresAt: DataTypes.DATE,
      usedAt: DataTypes.DATE,
      createdBy: DataTypes.STRING,
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'account_links' },
  )
}
