import { randomUUID } from 'node:crypto'
import request from 'supertest'
import { computeEstimate } from '#shared/domain/estimate'
import { AgreementPairListSchema, AgreementSummarySchema, AgreementTrendSchema } from '#shared/schemas/agreement'
import { ExamInputSchema, type ExamInputRaw } from '#shared/schemas/exam'
import { derivePairs } from '../../../server/agreement/pair-derivation.ts'
import { columnsOf } from '../../../server/exams/exam-record.ts'
import { ExamModel, RoundExaminerModel, RoundModel, RoundPatientCodeModel } from '../../../server/models/index.ts'
import { makeExamInput } from '../factories/exam.ts'
import { makeCaller } from '../helpers.ts'

type App = Parameters<typeof request>[0]

export const MINUTE = 60_000
export const DAY = 24 * 60 * MINUTE

export interface StoredExam {
  examinerId: string
  teamId: string
  /** examinedAt, epoch ms. */
  at: number
  heightCm?: number
  patientCode?: string
  status?: 'draft' | 'submitted' | 'countersigned' | 'returned'
  findings?: Partial<ExamInputRaw>
}

/** The columns the exams service would store for such an exam (same estimate). */
export function examValues(e: StoredExam) {
  const examinedAt = new Date(e.at).toISOString()
  const raw = makeExamInput({ teamId: e.teamId, patientCode: e.patientCode ?? 'SM-0142', examinedAt, heightCm: e.heightCm ?? 4, ...e.findings })
  const input = ExamInputSchema.parse(raw)
  const status = e.status ?? 'submitted'
  const workflow = { id: input.id, examinerId: e.examinerId, status, version: 2, submittedAt: status === 'draft' ? null : new Date(e.at) }
  return { ...workflow, ...columnsOf(input, computeEstimate(input)) }
}

/** Stores an exam straight into the table and derives its patient's pairs again, as the exams service would. */
export async function storeExam(e: StoredExam): Promise<ExamModel> {
  const sequelize = ExamModel.sequelize!
  return sequelize.transaction(async (transaction) => {
    const row = await ExamModel.create(examValues(e), { transaction })
    await derivePairs([row.patientCode], { sequelize, transaction })
    return row
  })
}

/** Stores many exams at once, in one transaction, and derives their patients' pairs once, after them all. */
export async function storeExams(exams: StoredExam[]): Promise<void> {
  const sequelize = ExamModel.sequelize!
  await sequelize.transaction(async (transaction) => {
    const rows = await ExamModel.bulkCreate(exams.map(examValues), { transaction })
    await derivePairs(
      rows.map((row) => row.patientCode),
      { sequelize, transaction },
    )
  })
}

/**
 * 30 resident–attending pairs in the team at one inclination, one a day ending `firstDayAgo` days ago, the attending
 * 30 minutes after the resident: the resident reads 2 and 6 cm in turn, the attending 4, so the differences alternate
 * +2 and −2 cm (SD(d) = √(120/29)) and the server's error term becomes local.
 */
export async function storeThirtyPairs(teamId: string, { codePrefix, firstDayAgo }: { codePrefix: string; firstDayAgo: number }) {
  const resident = await makeCaller({ roles: ['resident'], teamIds: [teamId] })
  const attending = await makeCaller({ roles: ['attending'], teamIds: [teamId] })
  await storeExams(
    Array.from({ length: 30 }, (_, i) => {
      const at = Date.now() - (i + firstDayAgo) * DAY
      return [
        { teamId, patientCode: `${codePrefix}${i}`, examinerId: resident.user.id, at, heightCm: i % 2 ? 2 : 6 },
        { teamId, patientCode: `${codePrefix}${i}`, examinerId: attending.user.id, at: at + 30 * MINUTE, heightCm: 4 },
      ]
    }).flat(),
  )
}

export async function summaryAs(app: App, auth: string, query: Record<string, string> = {}) {
  const res = await request(app).get('/api/agreement/summary').set('Authorization', auth).query(query)
  return { res, summary: res.status === 200 ? AgreementSummarySchema.parse(res.body) : undefined }
}

export async function pairsAs(app: App, auth: string, query: Record<string, string | number> = {}) {
  const res = await request(app).get('/api/agreement/pairs').set('Authorization', auth).query(query)
  return { res, list: res.status === 200 ? AgreementPairListSchema.parse(res.body) : undefined }
}

export async function trendAs(app: App, auth: string, query: Record<string, string> = {}) {
  const res = await request(app).get('/api/agreement/trend').set('Authorization', auth).query(query)
  return { res, trend: res.status === 200 ? AgreementTrendSchema.parse(res.body) : undefined }
}

export interface StoredRound {
  educatorId: string
  teamId: string
  examinerIds: string[]
  /** One row per patient code, one height per examiner in order; null leaves that entry unrecorded. */
  subjects: (number | null)[][]
  /** Closing time, epoch ms; the entries are dated a day earlier. */
  closedAt: number
  status?: 'open' | 'closed'
}

/** A calibration round with its entries, straight into the tables (as the rounds and exams services would store them). */
export async function storeRound(r: StoredRound): Promise<string> {
  const id = randomUUID()
  const status = r.status ?? 'closed'
  await RoundModel.create({ id, name: `Round ${id.slice(0, 8)}`, createdBy: r.educatorId, status, closedAt: status === 'closed' ? new Date(r.closedAt) : null })
  const codes = r.subjects.map((_, i) => `RC-${id.slice(0, 4)}-${i}`)
  await RoundPatientCodeModel.bulkCreate(codes.map((patientCode, position) => ({ roundId: id, patientCode, position })))
  await RoundExaminerModel.bulkCreate(r.examinerIds.map((examinerId, position) => ({ roundId: id, examinerId, position })))
  const entries = r.subjects.flatMap((row, i) =>
    row.flatMap((heightCm, j) => {
      if (heightCm === null) return []
      const at = r.closedAt - DAY + j * MINUTE
      return [{ examinerId: r.examinerIds[j]!, teamId: r.teamId, at, heightCm, patientCode: codes[i], findings: { roundId: id } }]
    }),
  )
  await storeExams(entries)
  return id
}
