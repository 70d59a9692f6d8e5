import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

/**
 * Two exams of one patient that form an agreement pair, earlier first, with what the agreement views read of each.
 * Derived data: `server/agreement/pair-derivation.ts` writes the rows of a patient code again in every write that
 * can change its pairs.
 */
export class AgreementPairModel extends Model<InferAttributes<AgreementPairModel>, InferCreationAttributes<AgreementPairModel>> {
  declare earlierExamId: string
  declare laterExamId: string
  declare patientCode: string
  /** The time of the pair: its earlier exam's. */
  declare pairedAt: Date
  declare meanInclinationDeg: number
  declare inclinationBand: string
  declare earlierExaminerId: string
  declare laterExaminerId: string
  declare earlierTeamId: string
  declare laterTeamId: string
  declare earlierExaminedAt: Date
  declare laterExaminedAt: Date
  /** h; null when that exam's column top was not filled (an upper bound without a height). */
  declare earlierHeightCm: number | null
  declare laterHeightCm: number | null
  /** The estimate, or for a bound its own limit. */
  declare earlierCvpCmH2O: number
  declare laterCvpCmH2O: number
  declare earlierInclinationDeg: number
  declare laterInclinationDeg: number
  declare earlierVein: string
  declare laterVein: string
  /** `seen` (a point height), `above-neck` (a lower bound) or `not-filled` (an upper bound). */
  declare earlierColumnTop: string
  declare laterColumnTop: string
}

export function initAgreementPairModel(sequelize: Sequelize): void {
  const id = DataTypes.STRING(36)
  const time = DataTypes.DATE
  const measure = DataTypes.DOUBLE
  const term = DataTypes.STRING(20)
  AgreementPairModel.init(
    {
      earlierExamId: { type: id, primaryKey: true },
      laterExamId: id,
      patientCode: DataTypes.STRING(40),
      pairedAt: time,
      meanInclinationDeg: measure,
      inclinationBand: term,
      earlierExaminerId: id,
      laterExaminerId: id,
      earlierTeamId: id,
      laterTeamId: id,
      earlierExaminedAt: time,
      laterExaminedAt: time,
      earlierHeightCm: measure,
      laterHeightCm: measure,
      earlierCvpCmH2O: measure,
      laterCvpCmH2O: measure,
      earlierInclinationDeg: measure,
      laterInclinationDeg: measure,
      earlierVein: term,
      laterVein: term,
      earlierColumnTop: term,
      laterColumnTop: term,
    },
    { sequelize, tableName: 'agreement_pairs', timestamps: false },
  )
}
