import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

/** A shared attempt counter (server/middleware/rate-limit-store.ts); `resetAt` in milliseconds since 1970. */
export class RateLimitHitModel extends Model<InferAttributes<RateLimitHitModel>, InferCreationAttributes<RateLimitHitModel>> {
  declare key: string
  declare hits: number
  declare resetAt: number
}

export function initRateLimitHitModel(sequelize: Sequelize): void {
  RateLimitHitModel.init(
    {
      key: { type: DataTypes.STRING(64), primaryKey: true },
      hits: DataTypes.INTEGER,
      resetAt: DataTypes.BIGINT,
    },
    { sequelize, tableName: 'rate_limit_hits', timestamps: false },
  )
}
