import { createHash } from 'node:crypto'
import { Op } from 'sequelize'
import { cmH2OToMmHg, mmHgToCmH2O, withoutFloatNoise } from '#shared/domain/units'
import type { ReferenceKind, ReferenceUnit } from '#shared/schemas/reference'
import { auditAll } from '../audit.ts'
import { ExamModel, ReferenceModel, UserModel } from '../models/index.ts'
import { loopId } from './demo-loop.ts'
import { seededRandom } from './demo-pairs.ts'

const MINUTE_MS = 60_000
const WARD = 'Ward 7 North — Cardiology'
// Paired demo patients whose first exam gets a measured pressure; with the named patients' about 40 in all.
const PAIR_EXAMS = 34
// Invented spread of the measured value about the estimate, wider than the band assumes, so some fall outside it.
const SPREAD_CMH2O = 3.4
const ATTENDING_OF_TEAM = (teamName: string) => (teamName === WARD ? 'attending' : 'attending2')
// Measured pressures on the demo's named patients: a three-day patient's exam (demo-loop.ts key) or a patient code's
// first exam, minutes after the exam, kind, value and unit.
const NAMED: [string, number, ReferenceKind, number, ReferenceUnit][] = [
  ['0301-a', 20, 'central-line', 14, 'mmHg'],
  ['0301-d', 30, 'central-line', 9, 'mmHg'],
  ['0301-f', 15, 'central-line', 6, 'mmHg'],
  ['0301-g', 25, 'central-line', 4, 'mmHg'],
  ['0320-a', 20, 'echo-ra', 8, 'mmHg'],
  ['SM-0163', 30, 'central-line', 18, 'mmHg'],
]

interface Planned {
  exam: ExamModel
  kind: ReferenceKind
  value: number
  unit: ReferenceUnit
  minutesAfter: number
}

/** An echocardiographic estimate is one of 3, 8 or 15 mmHg (Rudski et al. 2010, J Am Soc Echocardiogr 23:685–713). */
const echoOf = (mmHg: number) => (mmHg < 5.5 ? 3 : mmHg < 11.5 ? 8 : 15)

function planFor(exam: ExamModel, k: number, random: () => number): Planned {
  const truth = exam.cvpCmH2O! + SPREAD_CMH2O * Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random())
  const mmHg = cmH2OToMmHg(truth)
  // Now and then measured hours later: recorded, but not contemporaneous enough to pair.
  const minutesAfter = k % 17 === 16 ? 150 : 10 + (k % 5) * 9
  if (k % 4 === 0) return { exam, kind: 'echo-ra', value: echoOf(mmHg), unit: 'mmHg', minutesAfter }
  if (k % 8 === 2) return { exam, kind: 'central-line', value: Math.round(truth * 2) / 2, unit: 'cmH2O', minutesAfter }
  return { exam, kind: k % 4 === 3 ? 'catheter-ra' : 'central-line', value: Math.max(0, Math.round(mmHg)), unit: 'mmHg', minutesAfter }
}

async function planned(): Promise<Planned[]> {
  const random = seededRandom(20_261_211)
  // The first exam of each of the first paired patients of demo-pairs.ts: the same exams on every run.
  const codes = Array.from({ length: PAIR_EXAMS }, (_, k) => `SM-${2000 + k}`)
  const candidates = await ExamModel.findAll({
    where: { patientCode: { [Op.in]: codes }, columnTop: 'seen', status: { [Op.ne]: 'draft' } },
    order: [
      ['patientCode', 'ASC'],
      ['examinedAt', 'ASC'],
    ],
  })
  const older = candidates.filter((e, i) => i === 0 || candidates[i - 1]!.patientCode !== e.patientCode)
  const named = await Promise.all(
    NAMED.map(async ([key, minutesAfter, kind, value, unit]) => {
      const where = key.startsWith('SM-') ? { patientCode: key, status: { [Op.ne]: 'draft' } } : { id: loopId(key) }
      const exam = await ExamModel.findOne({ where, order: [['examinedAt', 'ASC']] })
      return exam ? [{ exam, kind, value, unit, minutesAfter }] : []
    }),
  )
  return [...older.map((exam, k) => planFor(exam, k, random)), ...named.flat()]
}

const referenceId = (examId: string, kind: string) =>
  createHash('sha256')
    .update(`plumbline-demo-reference/${examId}/${kind}`)
    .digest('hex')
    .replace(/^(.{8})(.{4})(.{3})(.{3})(.{12}).*$/, '$1-$2-8$3-a$4-$5')

/** Measured pressures beside about 40 demo exams, added by each team's attending; the same on every run. */
export async function seedDemoReferences(teamNames: Map<string, string>, now = new Date()): Promise<number> {
  const plans = await planned()
  const ids = plans.map((p) => referenceId(p.exam.id, p.kind))
  const existing = new Set((await ReferenceModel.findAll({ attributes: ['id'], where: { id: { [Op.in]: ids } } })).map((r) => r.id))
  const attendings = await UserModel.findAll({ where: { email: { [Op.in]: ['attending@saltmarsh.test', 'attending2@saltmarsh.test'] } } })
  const attendingId = new Map(attendings.map((u) => [u.email.split('@')[0]!, u.id]))
  const rows = plans.flatMap((p, i) => {
    const addedById = attendingId.get(ATTENDING_OF_TEAM(teamNames.get(p.exam.teamId) ?? ''))
    if (existing.has(ids[i]!) || !addedById) return []
    const valueCmH2O = p.unit === 'cmH2O' ? p.value : withoutFloatNoise(mmHgToCmH2O(p.value))
    const measuredAt = new Date(p.exam.examinedAt.getTime() + p.minutesAfter * MINUTE_MS)
    return [{ id: ids[i]!, examId: p.exam.id, kind: p.kind, value: p.value, unit: p.unit, valueCmH2O, measuredAt, addedById, addedAt: now }]
  })
  await ReferenceModel.bulkCreate(rows)
  const audits = rows.map(({ addedById, examId, addedAt: _at, ...reference }) => ({
    actorId: addedById,
    action: 'reference-add',
    entityType: 'exam',
    entityId: examId,
    changes: { reference: { from: null, to: { ...reference, examId, measuredAt: reference.measuredAt.toISOString() } } },
  }))
  await auditAll(audits)
  return rows.length
}
