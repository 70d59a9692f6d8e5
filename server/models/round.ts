import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

/** A blinded calibration round; `status` is `open` until its educator closes it. */
export class RoundModel extends Model<InferAttributes<RoundModel>, InferCreationAttributes<RoundModel>> {
  declare id: string
  declare name: string
  declare createdBy: string
  declare status: string
  declare createdAt: CreationOptional<Date>
  declare closedAt: Date | null
}

/** One patient code of a round; `position` keeps the order the educator gave. */
export class RoundPatientCodeModel extends Model<InferAttributes<RoundPatientCodeModel>, InferCreationAttributes<RoundPatientCodeModel>> {
  declare roundId: string
  declare patientCode: string
  declare position: number
}

/** One examiner of a round. */
export class RoundExaminerModel extends Model<InferAttributes<RoundExaminerModel>, InferCreationAttributes<RoundExaminerModel>> {
  declare roundId: string
  declare examinerId: string
  declare position: number
}

export function initRoundModels(sequelize: Sequelize): void {
  // A fresh object per attribute: Sequelize writes into the definitions it is given.
  const key = () => ({ type: DataTypes.STRING(36), primaryKey: true })
  RoundModel.init(
    {
      id: key(),
      name: DataTypes.STRING,
      createdBy: DataTypes.STRING,
      status: DataTypes.STRING,
      createdAt: DataTypes.DATE,
      closedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'rounds', updatedAt: false },
  )
  RoundPatientCodeModel.init(
    { roundId: key(), patientCode: { type: DataTypes.STRING(40), primaryKey: true }, position: DataTypes.INTEGER },
    { sequelize, tableName: 'round_patient_codes', timestamps: false },
  )
  RoundExaminerModel.init(
    { roundId: key(), examinerId: key(), position: DataTypes.INTEGER },
    { sequelize, tableName: 'round_examiners', timestamps: false },
  )
}
