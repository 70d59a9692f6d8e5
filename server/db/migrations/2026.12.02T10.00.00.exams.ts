import { DataTypes, type QueryInterface } from 'sequelize'

const code = (length: number) => ({ type: DataTypes.STRING(length), allowNull: false })
const json = { type: DataTypes.TEXT, allowNull: false }
const measure = { type: DataTypes.DOUBLE, allowNull: true }

export async function up(q: QueryInterface): Promise<void> {
  await q.createTable('exams', {
    id: { type: DataTypes.STRING(36), primaryKey: true },
    patientCode: code(40),
    // RESTRICT: removing a team or an account must never take clinical records with it.
    teamId: { ...code(36), references: { model: 'teams', key: 'id' }, onDelete: 'RESTRICT' },
    examinerId: { ...code(36), references: { model: 'users', key: 'id' }, onDelete: 'RESTRICT' },
    examinedAt: { type: DataTypes.DATE, allowNull: false },
    inclinationDeg: { type: DataTypes.DOUBLE, allowNull: false },
    inclinationSource: code(20),
    vein: code(20),
    columnTop: code(20),
    heightMethod: code(20),
    heightCm: measure,
    alongNeckCm: measure,
    readingPrecision: code(20),
    offsetModel: code(20),
    venousSigns: json,
    rhythm: code(30),
    waveform: json,
    respiratory: code(30),
    abdominojugular: json,
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    status: { ...code(20), defaultValue: 'draft' },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    estimate: json,
    // Copied out of `estimate` so lists can sort and filter on them in SQL.
    verticalHeightCm: measure,
    cvpCmH2O: measure,
    submittedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    updatedAt: { type: DataTypes.DATE, allowNull: false },
  })
  await q.addIndex('exams', ['examinerId'])
  await q.addIndex('exams', ['teamId', 'status'])
  await q.addIndex('exams', ['patientCode', 'examinedAt'])
}

export async function down(q: QueryInterface): Promise<void> {
  await q.dropTable('exams')
}
