import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

/** An electronic countersignature; append-only in the database (only `supersededAt` may be set, once). */
export class SignatureModel extends Model<InferAttributes<SignatureModel>, InferCreationAttributes<SignatureModel>> {
  declare id: string
  declare examId: string
  declare examVersion: number
  declare signerId: string
  declare signerName: string
  declare meaning: string
  declare signedAt: Date
  declare content: string
  declare contentHash: string
  declare supersededAt: Date | null
  /** With `reviewed-re-examined`: the attending's own exam of the patient. Not part of the signed content. */
  declare readingExamId: CreationOptional<string | null>
  /** JSON list of feedback codes, or null. */
  declare feedback: CreationOptional<string | null>
  declare feedbackText: CreationOptional<string | null>
}

export function initSignatureModel(sequelize: Sequelize): void {
  const text = DataTypes.STRING
  SignatureModel.init(
    {
      id: { type: DataTypes.STRING(36), primaryKey: true },
      examId: text,
      examVersion: DataTypes.INTEGER,
      signerId: text,
      signerName: text,
      meaning: text,
      signedAt: DataTypes.DATE,
      content: DataTypes.TEXT,
      contentHash: text,
      supersededAt: DataTypes.DATE,
      readingExamId: text,
      feedback: DataTypes.TEXT,
      feedbackText: DataTypes.TEXT,
    },
    { sequelize, tableName: 'signatures', timestamps: false },
  )
}
