import { createHash } from 'node:crypto'
import { Op } from 'sequelize'
import { ExamInputSchema } from '#shared/schemas/exam'
import { createExam, submitExam } from '../exams/exams.service.ts'
import { ExamModel, RoundModel, UserModel } from '../models/index.ts'
import { closeRound, createRound } from '../rounds/rounds.service.ts'
import { getUser } from '../users/users.service.ts'
import { VENOUS_SIGNS_SEEN } from './demo-signs.ts'

const ROUND_NAME = 'Ward 7 North calibration — November'
const WARD = 'Ward 7 North — Cardiology'
const AMU = 'Acute Medical Unit'
const DAY_MS = 86_400_000
const HOUR_MS = 3_600_000

// Invented patients of the invented Saltmarsh Teaching Hospital.
const CODES = ['SM-0311', 'SM-0312', 'SM-0313', 'SM-0314', 'SM-0315', 'SM-0316']
const INCLINATIONS = [45, 30, 45, 40, 60, 45]

/**
 * Each examiner's readings of h (cm above the sternal angle) in the order of CODES; null: the entry never made.
 * Invented habits: the residents read a little under the attending, as the pairs of demo-pairs.ts do.
 */
const EXAMINERS: { account: string; team: string; heights: (number | null)[] }[] = [
  { account: 'attending', team: WARD, heights: [1.5, 3.5, 6.5, 2, 8, 5] },
  { account: 'resident', team: WARD, heights: [0, 2.5, 5, 1, 6.5, 3.5] },
  { account: 'resident2', team: WARD, heights: [1, 3, 5.5, 2, 7.5, null] },
  { account: 'resident3', team: AMU, heights: [0.5, 2, 5, 1.5, 7, 3] },
]

/** A fixed UUID (version 8, RFC 9562) per demo entry, so reseeding finds the ones already made. */
function demoId(key: string): string {
  const hex = createHash('sha256').update(`plumbline-demo-round/${key}`).digest('hex')
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-8${hex.slice(13, 16)}-a${hex.slice(17, 20)}-${hex.slice(20, 32)}`
}

/**
 * One closed calibration round: the educator named six patients and four examiners of Ward 7 North and the AMU,
 * each examiner recorded blind through the exams service, one entry was never made, and the round was closed a week
 * ago. Created through the rounds and exams services (audit trail, estimates); a second run changes nothing.
 */
export async function seedDemoRound(teamIds: Map<string, string>, now = new Date()): Promise<number> {
  if (await RoundModel.findOne({ where: { name: ROUND_NAME } })) return 0
  const emails = ['educator', ...EXAMINERS.map((e) => e.account)].map((a) => `${a}@saltmarsh.test`)
  const accounts = await UserModel.findAll({ where: { email: { [Op.in]: emails } } })
  const idOf = new Map(accounts.map((u) => [u.email.split('@')[0]!, u.id]))
  const educator = idOf.get('educator') && (await getUser(idOf.get('educator')!))
  if (!educator || EXAMINERS.some((e) => !idOf.has(e.account))) return 0

  const round = await createRound(educator, { name: ROUND_NAME, patientCodes: CODES, examinerIds: EXAMINERS.map((e) => idOf.get(e.account)!) })
  const start = now.getTime() - 8 * DAY_MS
  for (const [j, examiner] of EXAMINERS.entries()) {
    const author = (await getUser(idOf.get(examiner.account)!))!
    for (const [i, patientCode] of CODES.entries()) {
      const heightCm = examiner.heights[i]
      if (heightCm === null || heightCm === undefined) continue
      const id = demoId(`${examiner.account}/${patientCode}`)
      if (await ExamModel.findByPk(id)) continue
      const examinedAt = new Date(start + i * 2 * HOUR_MS + j * 20 * 60_000).toISOString()
      const input = ExamInputSchema.parse({
        id,
        patientCode,
        roundId: round.id,
        teamId: teamIds.get(examiner.team),
        examinedAt,
        inclinationDeg: INCLINATIONS[i],
        vein: 'right-internal',
        columnTop: 'seen',
        heightCm,
        readingPrecision: 'ruler',
        venousSigns: VENOUS_SIGNS_SEEN,
        rhythm: 'sinus',
        respiratory: 'falls-on-inspiration',
      })
      await createExam(author, input)
      await submitExam(author, id)
    }
  }
  await closeRound(educator, round.id)
  // The round's own dates, as they would have been: opened the day before the exams, closed a week ago.
  await RoundModel.update({ createdAt: new Date(start - DAY_MS), closedAt: new Date(now.getTime() - 7 * DAY_MS) }, { where: { id: round.id }, silent: true })
  return 1
}
