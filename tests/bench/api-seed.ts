// Bulk exams for `npm run bench:api`: demo hospital first, then `count` synced exams, half of them by one resident.
import { randomUUID } from 'node:crypto'
import type { Sequelize, Transaction } from 'sequelize'
import { computeEstimate } from '#shared/domain/estimate'
import { ExamInputSchema, type ExamInput } from '#shared/schemas/exam'
import { deriveAllPairs } from '../../server/agreement/pair-derivation.ts'
import { seedDemo } from '../../server/demo/seed.ts'
import { columnsOf } from '../../server/exams/exam-record.ts'
import { ExamModel, MembershipModel, UserModel } from '../../server/models/index.ts'
import { sha256, signedContent } from '../../server/supervision/signed-content.ts'

/** Rows per multi-row INSERT, and per transaction: a commit per 50,000 exams keeps SQLite's journal work small. */
const CHUNK = 2_000
const PER_TRANSACTION = 50_000
const START = Date.UTC(2025, 0, 1)

export interface BenchStaff {
  heavy: { id: string; teamId: string }
  others: { id: string; teamId: string }[]
  attending: { id: string; name: string }
}

async function staffOf(): Promise<BenchStaff> {
  const byEmail = async (email: string) => (await UserModel.findOne({ where: { email } }))!
  const memberships = await MembershipModel.findAll()
  const teamOf = (id: string) => memberships.find((m) => m.userId === id)!.teamId
  const heavy = await byEmail('resident@saltmarsh.test')
  const attending = await byEmail('attending@saltmarsh.test')
  const residents = await UserModel.findAll({ where: { id: memberships.map((m) => m.userId) } })
  const others = residents.filter((u) => u.email.startsWith('resident') && u.id !== heavy.id)
  return {
    heavy: { id: heavy.id, teamId: teamOf(heavy.id) },
    others: others.map((u) => ({ id: u.id, teamId: teamOf(u.id) })),
    attending: { id: attending.id, name: attending.displayName },
  }
}

const estimates = new Map<string, ReturnType<typeof computeEstimate>>()

/** The estimate depends on the findings only: the bench's 713 combinations are each computed once. */
function estimateOf(input: ExamInput) {
  const key = `${input.heightCm}/${input.inclinationDeg}`
  if (!estimates.has(key)) estimates.set(key, computeEstimate(input))
  return estimates.get(key)!
}

const RUN = randomUUID().slice(24)

/**
 * A UUID (version 7 layout) whose leading digits count up: each new row lands at the end of the primary key and of
 * every `(…, id)` index instead of at a random place, so seeding writes pages in order rather than all over the file.
 */
function orderedId(kind: 'exam' | 'signature', i: number): string {
  const n = i.toString(16).padStart(12, '0')
  return `${n.slice(0, 8)}-${n.slice(8)}-7000-${kind === 'exam' ? '8000' : '9000'}-${RUN}`
}

/** Exam i: every other one by the heavy resident; pairs of exams 30 min apart on one patient; one in ten waiting for sign-off. */
function examRow(base: ExamInput, staff: BenchStaff, i: number) {
  const examiner = i % 2 === 0 ? staff.heavy : staff.others[i % staff.others.length]!
  const at = START + Math.floor(i / 2) * 5 * 60_000 + (i % 2) * 30 * 60_000
  const input: ExamInput = {
    ...base,
    id: orderedId('exam', i),
    patientCode: `BN-${Math.floor(i / 2)}`,
    teamId: examiner.teamId,
    examinedAt: new Date(at).toISOString(),
    heightCm: (i % 23) / 2,
    inclinationDeg: 30 + (i % 31),
  }
  const status = i % 10 === 0 ? 'submitted' : 'countersigned'
  const times = { createdAt: new Date(at), updatedAt: new Date(at + 3_600_000), submittedAt: new Date(at + 600_000) }
  return { id: input.id, examinerId: examiner.id, status, version: 1, ...times, ...columnsOf(input, estimateOf(input)) }
}

/** The row as inserted carries every field the signed content reads (dates as Dates, JSON as text): no model instance needed. */
function signatureOf(row: ReturnType<typeof examRow>, staff: BenchStaff, i: number) {
  const content = signedContent(row as unknown as ExamModel)
  const signer = { signerId: staff.attending.id, signerName: staff.attending.name, meaning: 'reviewed-agree' }
  return {
    id: orderedId('signature', i),
    examId: row.id,
    examVersion: row.version,
    ...signer,
    signedAt: row.updatedAt,
    content,
    contentHash: sha256(content),
    supersededAt: null,
  }
}

/** Straight inserts, no model instances: the rows are built as the exams service stores them (columnsOf). */
async function insertChunk(base: ExamInput, staff: BenchStaff, from: number, to: number, transaction: Transaction) {
  const rows = []
  for (let i = from; i < to; i++) rows.push(examRow(base, staff, i))
  const q = ExamModel.sequelize!.getQueryInterface()
  await q.bulkInsert('exams', rows, { transaction })
  const signed = rows.flatMap((row, k) => (row.status === 'countersigned' ? [signatureOf(row, staff, from + k)] : []))
  await q.bulkInsert('signatures', signed, { transaction })
}

/** The demo hospital plus `count` exams with their signatures and agreement pairs; answers who recorded them. */
export async function seedBench(sequelize: Sequelize, count: number): Promise<BenchStaff> {
  await seedDemo()
  const staff = await staffOf()
  const base = ExamInputSchema.parse({
    ...{ id: randomUUID(), patientCode: 'BN-0', teamId: staff.heavy.teamId, examinedAt: new Date(START).toISOString() },
    ...{ inclinationDeg: 45, vein: 'right-internal', columnTop: 'seen', heightCm: 4 },
  })
  for (let from = 0; from < count; from += PER_TRANSACTION)
    await sequelize.transaction(async (transaction) => {
      for (let at = from; at < Math.min(count, from + PER_TRANSACTION); at += CHUNK)
        await insertChunk(base, staff, at, Math.min(count, at + CHUNK), transaction)
    })
  const inserted = performance.now()
  // The pairs table as exam writes keep it, derived in one pass as the migration's backfill does.
  await sequelize.transaction((transaction) => deriveAllPairs({ sequelize, transaction }))
  console.log(`Pairs derived in ${((performance.now() - inserted) / 1000).toFixed(1)} s`)
  return staff
}
