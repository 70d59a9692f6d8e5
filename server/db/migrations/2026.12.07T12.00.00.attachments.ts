import { DataTypes, type QueryInterface } from 'sequelize'

/** Photos of an exam's measurement set-up; the bytes live on disk under DATA_DIR/attachments, named by `storedName`. */
export async function up(q: QueryInterface): Promise<void> {
  const user = { type: DataTypes.STRING(36), allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'RESTRICT' }
  await q.createTable('attachments', {
    id: { type: DataTypes.STRING(36), primaryKey: true },
    examId: { type: DataTypes.STRING(36), allowNull: false, references: { model: 'exams', key: 'id' }, onDelete: 'RESTRICT' },
    // A random name made by the server; the sender's file name is never a path.
    storedName: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    displayName: { type: DataTypes.STRING(120), allowNull: false },
    mimeType: { type: DataTypes.STRING(20), allowNull: false },
    byteSize: { type: DataTypes.INTEGER, allowNull: false },
    width: { type: DataTypes.INTEGER, allowNull: true },
    height: { type: DataTypes.INTEGER, allowNull: true },
    sha256: { type: DataTypes.STRING(64), allowNull: false },
    consentConfirmedBy: user,
    createdBy: user,
    createdAt: { type: DataTypes.DATE, allowNull: false },
    // A removed photo keeps its row (who, when, which hash) and loses its file.
    deletedAt: { type: DataTypes.DATE, allowNull: true },
  })
  await q.addIndex('attachments', ['examId'])
}

export async function down(q: QueryInterface): Promise<void> {
  await q.dropTable('attachments')
}
