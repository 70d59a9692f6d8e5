import { createHash } from 'node:crypto'
import { Op } from 'sequelize'
import { ExamInputSchema, type Vein } from '#shared/schemas/exam'
import { changesBetween, snapshotOf } from '../exams/exam-changes.ts'
import { columnsOf } from '../exams/exam-record.ts'
import { invalidateObserverTerm } from '../agreement/observer-term.ts'
import { derivePairs } from '../agreement/pair-derivation.ts'
import { auditAll, type AuditEntry } from '../audit.ts'
import { writeTransaction } from '../db/transaction.ts'
import { ExamModel, UserModel } from '../models/index.ts'
import { estimateContext, estimateWith, type EstimateContext } from '../settings/settings-estimate.ts'
import { VENOUS_SIGNS_SEEN } from './demo-signs.ts'

const PAIRS = 150
const SPAN_DAYS = 120
const DAY_MS = 86_400_000
const MINUTE_MS = 60_000
const WARD = 'Ward 7 North — Cardiology'
const AMU = 'Acute Medical Unit'
const MICU = 'Medical ICU'

// Invented habits: each resident's usual reading against their attending's, in cm. Trainees tend to under-read.
const RESIDENTS = [
  { account: 'resident', team: WARD, biasCm: -1.6 },
  { account: 'resident2', team: WARD, biasCm: -0.9 },
  { account: 'resident3', team: AMU, biasCm: -1.3 },
  { account: 'resident4', team: AMU, biasCm: -0.8 },
  { account: 'resident5', team: MICU, biasCm: -1.6 },
  { account: 'resident6', team: MICU, biasCm: -0.8 },
]
const ATTENDING_OF: Record<string, string> = { [WARD]: 'attending', [AMU]: 'attending2', [MICU]: 'attending2' }
// Each reading's own error; the difference of two then has an SD of about 1.5 cm.
const READING_SD_CM = 1.05
// Mostly the right internal jugular, as taught; now and then the external or the left.
const VEINS: Vein[] = [...Array<Vein>(6).fill('right-internal'), 'right-external', 'left-internal']

/** mulberry32: a small, fast 32-bit PRNG, so the demo is the same on every machine. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6d2b79f5) >>> 0
    let t = Math.imul(a ^ (a >>> 15), 1 | a)
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

/** A standard normal draw (Box–Muller). */
const normal = (random: () => number) => Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random())
const halfCm = (cm: number) => Math.min(30, Math.max(-10, Math.round(cm * 2) / 2))

/** A fixed UUID (version 8, RFC 9562) per demo exam, so reseeding finds the ones already made. */
function demoId(key: string): string {
  const hex = createHash('sha256').update(`plumbline-demo-pair/${key}`).digest('hex')
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-8${hex.slice(13, 16)}-a${hex.slice(17, 20)}-${hex.slice(20, 32)}`
}

interface PlannedExam {
  id: string
  account: string
  team: string
  examinedAt: Date
  findings: { patientCode: string; heightCm: number; inclinationDeg: number; vein: Vein }
}

/** A resident and their attending examine one patient within the hour or so, the resident usually first. */
function planPair(k: number, random: () => number, now: number): PlannedExam[] {
  const resident = RESIDENTS[k % RESIDENTS.length]!
  const truth = 2.5 + 3 * normal(random)
  const inclinationDeg = 30 + 5 * Math.floor(random() * 7)
  const shared = { patientCode: `SM-${2000 + k}`, inclinationDeg, vein: VEINS[Math.floor(random() * VEINS.length)]! }
  const residentAt = now - (3 + random() * SPAN_DAYS) * DAY_MS
  const gap = (15 + random() * 75) * MINUTE_MS * (random() < 0.8 ? 1 : -1)
  const reading = (account: string, biasCm: number, at: number): PlannedExam => ({
    id: demoId(`${k}/${account}`),
    account,
    team: resident.team,
    examinedAt: new Date(at),
    findings: { ...shared, heightCm: halfCm(truth + biasCm + READING_SD_CM * normal(random)) },
  })
  return [reading(resident.account, resident.biasCm, residentAt), reading(ATTENDING_OF[resident.team]!, 0, residentAt + gap)]
}

function columnsFor(plan: PlannedExam, examinerId: string, teamId: string, context: EstimateContext) {
  const input = ExamInputSchema.parse({
    ...plan.findings,
    id: plan.id,
    teamId,
    examinedAt: plan.examinedAt.toISOString(),
    columnTop: 'seen',
    venousSigns: VENOUS_SIGNS_SEEN,
    rhythm: 'sinus',
    respiratory: 'falls-on-inspiration',
  })
  const submittedAt = new Date(plan.examinedAt.getTime() + 20 * MINUTE_MS)
  return { id: plan.id, examinerId, status: 'submitted', version: 2, submittedAt, ...columnsOf(input, estimateWith(input, context)) }
}

/** The audit entry the exams service writes for a new exam (chained like every other: server/audit.ts). */
function createdEvent(row: ExamModel): AuditEntry {
  return { actorId: row.examinerId, action: 'exam-create', entityType: 'exam', entityId: row.id, changes: changesBetween(null, snapshotOf(row)) }
}

/**
 * Four months of paired resident–attending exams across the three teams for the agreement views, inserted in bulk with
 * their estimates and audit entries; the same on every run, and exams already present are left alone.
 */
export async function seedDemoPairs(teamIds: Map<string, string>, now = new Date()): Promise<number> {
  const random = seededRandom(20_261_205)
  const plans = Array.from({ length: PAIRS }, (_, k) => planPair(k, random, now.getTime())).flat()
  const emails = [...new Set(plans.map((p) => `${p.account}@saltmarsh.test`))]
  const accounts = await UserModel.findAll({ where: { email: { [Op.in]: emails } } })
  const userIds = new Map(accounts.map((u) => [u.email.split('@')[0]!, u.id]))
  const stored = await ExamModel.findAll({ attributes: ['id'], where: { id: { [Op.in]: plans.map((p) => p.id) } } })
  const existing = new Set(stored.map((e) => e.id))
  const missing = plans.filter((p) => !existing.has(p.id) && userIds.has(p.account) && teamIds.has(p.team))
  const context = await estimateContext()
  const created = await writeTransaction(ExamModel.sequelize!, async (transaction) => {
    const values = missing.map((p) => columnsFor(p, userIds.get(p.account)!, teamIds.get(p.team)!, context))
    const rows = await ExamModel.bulkCreate(values, { transaction })
    await derivePairs(rows.map((row) => row.patientCode), { sequelize: ExamModel.sequelize!, transaction })
    await auditAll(rows.map(createdEvent), { transaction })
    return rows.length
  })
  // The pairs bypass the exams service, which would otherwise drop a σ_observer cached before they existed.
  if (created > 0) invalidateObserverTerm()
  return created
}
