import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

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

export function initAttachmentModel(sequelize: Sequelize): void {
  const id36 = DataTypes.STRING(36)
  AttachmentModel.init(
    {
      id: { type: id36, primaryKey: true },
      examId: id36,
      storedName: DataTypes.STRING(64),
      displayName: DataTypes.STRING(120),
      mimeType: DataTypes.STRING(20),
      byteSize: DataTypes.INTEGER,
      width: DataTypes.INTEGER,
      height: DataTypes.INTEGER,
      sha256: DataTypes.STRING(64),
      consentConfirmedBy: id36,
      createdBy: id36,
      createdAt: DataTypes.DATE,
      deletedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'attachments', timestamps: false },
  )
}
