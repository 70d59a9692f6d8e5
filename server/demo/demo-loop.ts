import { createHash } from 'node:crypto'
import { ExamInputSchema, type ExamInputRaw } from '#shared/schemas/exam'
import type { CountersignInput } from '#shared/schemas/signature'
import { Op, type Transaction } from 'sequelize'
import type { User } from '#shared/schemas/user'
import { invalidateObserverTerm } from '../agreement/observer-term.ts'
import { derivePairs } from '../agreement/pair-derivation.ts'
import { auditAll } from '../audit.ts'
import { changesBetween, snapshotOf } from '../exams/exam-changes.ts'
import { columnsOf } from '../exams/exam-columns.ts'
import { inTransaction } from '../exams/exam-writes.ts'
import { ExamModel, UserModel } from '../models/index.ts'
import { estimateContext, estimateWith, type EstimateContext } from '../settings/settings-estimate.ts'
import { applyCountersignature } from '../supervision/countersign.service.ts'
import { getUser } from '../users/users.service.ts'
import { VENOUS_SIGNS_SEEN } from './demo-signs.ts'

const HOUR_MS = 3_600_000
const WARD = 'Ward 7 North — Cardiology'
const AMU = 'Acute Medical Unit'

type Signing = Omit<CountersignInput, 'password' | 'baseVersion'> & { by: string }

interface LoopExam {
  key: string
  author: string
  team: string
  patientCode: string
  hoursAgo: number
  heightCm: number
  /** The team's attending countersigns, after re-examining the patient, an hour later. */
  signed?: Signing
}

const reading = (heightCm: number) => ({ heightCm, inclinationDeg: 45 })
const reExamined = (by: string, heightCm: number, more: Partial<Signing> = {}): Signing => ({
  by,
  meaning: 'reviewed-re-examined',
  attendingReading: reading(heightCm),
  ...more,
})

// Invented patients. SM-0301 is followed by the ward through three days of diuresis for heart failure.
export const LOOP_EXAMS: LoopExam[] = [
  {
    key: '0301-a',
    author: 'resident',
    team: WARD,
    patientCode: 'SM-0301',
    hoursAgo: 70,
    heightCm: 9,
    signed: reExamined('attending', 10.5, { feedback: ['read-peak-not-mean'] }),
  },
  { key: '0301-b', author: 'resident2', team: WARD, patientCode: 'SM-0301', hoursAgo: 62, heightCm: 8 },
  { key: '0301-c', author: 'attending', team: WARD, patientCode: 'SM-0301', hoursAgo: 50, heightCm: 7 },
  { key: '0301-d', author: 'resident', team: WARD, patientCode: 'SM-0301', hoursAgo: 46, heightCm: 5.5 },
  { key: '0301-e', author: 'resident2', team: WARD, patientCode: 'SM-0301', hoursAgo: 26, heightCm: 4.5 },
  {
    key: '0301-f',
    author: 'resident',
    team: WARD,
    patientCode: 'SM-0301',
    hoursAgo: 22,
    heightCm: 3,
    signed: reExamined('attending', 4, { feedback: ['not-at-end-expiration'] }),
  },
  { key: '0301-g', author: 'resident', team: WARD, patientCode: 'SM-0301', hoursAgo: 6, heightCm: 2 },
  {
    key: '0310-a',
    author: 'resident2',
    team: WARD,
    patientCode: 'SM-0310',
    hoursAgo: 34,
    heightCm: 7,
    signed: reExamined('attending', 3, {
      feedback: ['carotid-mistaken', 'other'],
      feedbackText: 'Press lightly above the clavicle: the vein is obliterated, the carotid is not.',
    }),
  },
  {
    key: '0320-a',
    author: 'resident3',
    team: AMU,
    patientCode: 'SM-0320',
    hoursAgo: 18,
    heightCm: 2,
    signed: reExamined('attending2', 3.5, { feedback: ['position', 'wrong-reference-point'] }),
  },
]

/** A fixed UUID (version 8, RFC 9562) per demo exam, so reseeding finds the ones already made. */
export function loopId(key: string): string {
  const hex = createHash('sha256').update(`plumbline-demo-loop/${key}`).digest('hex')
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-8${hex.slice(13, 16)}-a${hex.slice(17, 20)}-${hex.slice(20, 32)}`
}

const userByAccount = async (account: string) => {
  const row = await UserModel.findOne({ where: { email: `${account}@saltmarsh.test` } })
  return row && getUser(row.id)
}

function inputOf(e: LoopExam, teamId: string, now: number) {
  const findings: ExamInputRaw = {
    id: loopId(e.key),
    patientCode: e.patientCode,
    teamId,
    examinedAt: new Date(now - e.hoursAgo * HOUR_MS).toISOString(),
    inclinationDeg: 45,
    vein: 'right-internal',
    columnTop: 'seen',
    heightCm: e.heightCm,
    venousSigns: VENOUS_SIGNS_SEEN,
    rhythm: 'sinus',
    respiratory: 'falls-on-inspiration',
  }
  return ExamInputSchema.parse(findings)
}

/** The row as the exams service stores a submitted exam, with the estimate under the settings in force. */
function rowOf(e: LoopExam, examinerId: string, teamId: string, now: number, context: EstimateContext) {
  const input = inputOf(e, teamId, now)
  const submittedAt = new Date(Date.parse(input.examinedAt) + 20 * 60_000)
  return { id: input.id, examinerId, status: 'submitted', version: 2, submittedAt, ...columnsOf(input, estimateWith(input, context)) }
}

/** Countersigns as the attending would, an hour after the exam, without the password a person types. */
async function countersign(row: ExamModel, signing: Signing, signer: User, context: EstimateContext, transaction: Transaction) {
  const { by: _by, ...input } = signing
  const signedAt = new Date(row.examinedAt.getTime() + HOUR_MS)
  const at = { signedAt, examinedAt: new Date(signedAt.getTime() - 10 * 60_000), context }
  await applyCountersignature(signer, row, input, at, transaction)
}

const createdEvent = (row: ExamModel) => ({
  actorId: row.examinerId,
  action: 'exam-create',
  entityType: 'exam',
  entityId: row.id,
  changes: changesBetween(null, snapshotOf(row)),
})

/**
 * The patient followed over three days and the attendings' readings with feedback, in one transaction with their
 * estimates, pairs, signatures and audit entries; exams already present are left alone.
 */
export async function seedDemoLoop(teamIds: Map<string, string>, now = new Date()): Promise<number> {
  const accounts = new Map<string, User>()
  for (const account of new Set(LOOP_EXAMS.flatMap((e) => [e.author, e.signed?.by ?? e.author]))) {
    const user = await userByAccount(account)
    if (user) accounts.set(account, user)
  }
  const stored = new Set(
    (await ExamModel.findAll({ attributes: ['id'], where: { id: { [Op.in]: LOOP_EXAMS.map((e) => loopId(e.key)) } } })).map((r) => r.id),
  )
  const missing = LOOP_EXAMS.filter((e) => !stored.has(loopId(e.key)) && accounts.has(e.author) && teamIds.has(e.team))
  if (!missing.length) return 0
  const context = await estimateContext()
  await inTransaction(async (transaction) => {
    const values = missing.map((e) => rowOf(e, accounts.get(e.author)!.id, teamIds.get(e.team)!, now.getTime(), context))
    const rows = await ExamModel.bulkCreate(values, { transaction })
    await auditAll(rows.map(createdEvent), { transaction })
    await derivePairs(new Set(rows.map((r) => r.patientCode)), { sequelize: ExamModel.sequelize!, transaction })
    for (const [i, e] of missing.entries()) {
      const signer = e.signed && accounts.get(e.signed.by)
      if (signer) await countersign(rows[i]!, e.signed!, signer, context, transaction)
    }
  })
  // The exams bypass the exams service, which would otherwise drop a σ_observer cached before they existed.
  invalidateObserverTerm()
  return missing.length
}
