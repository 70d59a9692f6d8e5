import { QueryTypes } from 'sequelize'
import { PairReadingSchema, type AgreementPair, type PairReading } from '#shared/schemas/agreement'
import { ExamModel } from '../models/index.ts'
import type { Examiner } from './examiners.ts'
import type { Pair, Reading } from './pairs.ts'
import { categoryOfReading, isElevated } from './reading-categories.ts'

interface ExamDetails {
  rowid: number
  id: string
  patientCode: string
  examinerId: string
  inclinationDeg: number
  vein: string
}

async function detailsOf(pairs: Pair[]): Promise<Map<number, ExamDetails>> {
  const rowids = pairs.flatMap((p) => [p.first.rowid, p.second.rowid])
  if (!rowids.length) return new Map()
  const rows = await ExamModel.sequelize!.query<ExamDetails>(
    'SELECT rowid AS rowid, id, patientCode, examinerId, inclinationDeg, vein FROM exams WHERE rowid IN (:rowids)',
    { type: QueryTypes.SELECT, replacements: { rowids } },
  )
  return new Map(rows.map((r) => [r.rowid, r]))
}

function readingOf(r: Reading, details: ExamDetails, examiner: Examiner | undefined): PairReading {
  return PairReadingSchema.parse({
    examId: details.id,
    examinerId: r.examinerId,
    examinerName: examiner?.name ?? '',
    role: examiner?.role ?? 'resident',
    teamId: r.teamId,
    examinedAt: new Date(r.at).toISOString(),
    heightCm: r.heightCm,
    inclinationDeg: details.inclinationDeg,
    vein: details.vein,
    category: categoryOfReading(r),
    elevated: isElevated(r),
  })
}

/** One page of pairs with the exams' details, and the patient code as the viewer may see it. */
export async function presentPairs(
  pairs: Pair[],
  examiners: Map<string, Examiner>,
  codeOf: (pair: Pair) => string,
): Promise<AgreementPair[]> {
  const details = await detailsOf(pairs)
  // A rowid no longer naming the same exam (deleted since, or renumbered by a VACUUM) leaves its pair off the page.
  const detailsFor = (r: Reading) => {
    const found = details.get(r.rowid)
    return found?.examinerId === r.examinerId && found.patientCode === r.patientCode ? found : undefined
  }
  return pairs.flatMap((pair) => {
    const { first, second } = pair
    const [a, b] = [detailsFor(first), detailsFor(second)]
    if (!a || !b) return []
    return {
      patientCode: codeOf(pair),
      order: pair.order,
      differenceCm: first.heightCm - second.heightCm,
      meanCm: (first.heightCm + second.heightCm) / 2,
      minutesApart: Math.abs(second.at - first.at) / 60_000,
      first: readingOf(first, a, examiners.get(first.examinerId)),
      second: readingOf(second, b, examiners.get(second.examinerId)),
    }
  })
}
