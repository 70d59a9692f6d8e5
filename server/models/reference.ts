import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

/** A measured pressure recorded beside an exam; append-only in the database. */
export class ReferenceModel extends Model<InferAttributes<ReferenceModel>, InferCreationAttributes<ReferenceModel>> {
  declare id: string
  declare examId: string
  declare kind: string
  declare value: number
  declare unit: string
  /** The value in cmH₂O (NIST SP 811 factors), stored so the accuracy summary compares without converting. */
  declare valueCmH2O: number
  declare measuredAt: Date
  declare addedById: string
  declare addedAt: Date
}

export function initReferenceModel(sequelize: Sequelize): void {
  ReferenceModel.init(
    {
      id: { type: DataTypes.STRING(36), primaryKey: true },
      examId: DataTypes.STRING(36),
      kind: DataTypes.STRING(20),
      value: DataTypes.DOUBLE,
      unit: DataTypes.STRING(10),
      valueCmH2O: DataTypes.DOUBLE,
      measuredAt: DataTypes.DATE,
      addedById: DataTypes.STRING(36),
      addedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'reference_measurements', timestamps: false },
  )
}
