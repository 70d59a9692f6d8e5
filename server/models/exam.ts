import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

/** One bedside exam; list-valued findings and the estimate are JSON text, parsed by `server/exams/exam-record.ts`. */
export class ExamModel extends Model<InferAttributes<ExamModel>, InferCreationAttributes<ExamModel>> {
  declare id: string
  declare patientCode: string
  declare teamId: string
  declare examinerId: string
  declare examinedAt: Date
  declare inclinationDeg: number
  declare inclinationSource: string
  declare vein: string
  declare columnTop: string
  declare heightMethod: string
  declare heightCm: number | null
  declare alongNeckCm: number | null
  declare readingPrecision: string
  declare offsetModel: string
  /** JSON: an object keyed by sign, or the older list of present signs; read through the shared schema. */
  declare venousSigns: string
  declare venousConfirmed: CreationOptional<boolean>
  declare notAssessableReason: CreationOptional<string | null>
  declare notAssessableText: CreationOptional<string | null>
  /** JSON list of context flags. */
  declare context: CreationOptional<string>
  declare rhythm: string
  declare waveform: string
  declare respiratory: string
  declare abdominojugular: string
  declare notes: string
  declare status: string
  declare version: number
  declare estimate: string
  declare verticalHeightCm: number | null
  declare cvpCmH2O: number | null
  /** The stored 95% band's ends (estimate.bandCmH2O), null on a bound's open side or without an estimate. */
  declare bandLowCmH2O: CreationOptional<number | null>
  declare bandHighCmH2O: CreationOptional<number | null>
  declare submittedAt: Date | null
  declare returnComment: CreationOptional<string | null>
  /** The calibration round this exam is an entry of, if any. */
  declare roundId: CreationOptional<string | null>
  /** The pull cursor: set by database triggers on every insert and update, never by the app. */
  declare syncSeq: CreationOptional<number | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export function initExamModel(sequelize: Sequelize): void {
  const text = DataTypes.STRING
  const measure = DataTypes.DOUBLE
  ExamModel.init(
    {
      id: { type: DataTypes.STRING(36), primaryKey: true },
      patientCode: text,
      teamId: text,
      examinerId: text,
      examinedAt: DataTypes.DATE,
      inclinationDeg: measure,
      inclinationSource: text,
      vein: text,
      columnTop: text,
      heightMethod: text,
      heightCm: measure,
      alongNeckCm: measure,
      readingPrecision: text,
      offsetModel: text,
      venousSigns: DataTypes.TEXT,
      venousConfirmed: DataTypes.BOOLEAN,
      notAssessableReason: text,
      notAssessableText: DataTypes.TEXT,
      context: DataTypes.TEXT,
      rhythm: text,
      waveform: DataTypes.TEXT,
      respiratory: text,
      abdominojugular: DataTypes.TEXT,
      notes: DataTypes.TEXT,
      status: text,
      version: DataTypes.INTEGER,
      estimate: DataTypes.TEXT,
      verticalHeightCm: measure,
      cvpCmH2O: measure,
      bandLowCmH2O: measure,
      bandHighCmH2O: measure,
      submittedAt: DataTypes.DATE,
      returnComment: DataTypes.TEXT,
      roundId: DataTypes.STRING,
      syncSeq: DataTypes.INTEGER,
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'exams' },
  )
}
