import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import { ExamModel } from '../models/index.ts'

/** A photo of an exam's measurement set-up; its bytes are a file named `storedName` in the attachments folder. */
export class AttachmentModel extends Model<InferAttributes<AttachmentModel>, InferCreationAttributes<AttachmentModel>> {
  declare id: string
  declare examId: string
  declare storedName: string
  declare displayName: string
  declare mimeType: string
  declare byteSize: number
  declare width: number | null
  declare height: number | null
  declare sha256: string
  declare consentConfirmedBy: string
  declare createdBy: string
  declare createdAt: Date
  declare deletedAt: Date | null
}

function init(sequelize: Sequelize): void {
  AttachmentModel.init(
    {
      id: { type: DataTypes.STRING(36), primaryKey: true },
      examId: DataTypes.STRING(36),
      storedName: DataTypes.STRING(64),
      displayName: DataTypes.STRING(120),
      mimeType: DataTypes.STRING(20),
      byteSize: DataTypes.INTEGER,
      width: DataTypes.INTEGER,
      height: DataTypes.INTEGER,
      sha256: DataTypes.STRING(64),
      consentConfirmedBy: DataTypes.STRING(36),
      createdBy: DataTypes.STRING(36),
      createdAt: DataTypes.DATE,
      deletedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'attachments', timestamps: false },
  )
}

/**
 * The model, bound to the connection the exam model uses (bound here rather than in `initModels`, so this folder
 * stays self-contained); rebound when a test opens a new database.
 */
export function attachments(): typeof AttachmentModel {
  const sequelize = ExamModel.sequelize
  if (!sequelize) throw new Error('The models are not bound to a database yet')
  if (AttachmentModel.sequelize !== sequelize) init(sequelize)
  return AttachmentModel
}
