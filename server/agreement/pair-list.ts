import { PairReadingSchema, type AgreementPair, type PairReading } from '#shared/schemas/agreement'
import type { Examiner } from './examiners.ts'
import type { Pair, Reading } from './pairs.ts'
import { categoryOfReading, elevatedOfReading, pointHeight } from './reading-categories.ts'

function readingOf(r: Reading, examiner: Examiner | undefined): PairReading {
  return PairReadingSchema.parse({
    examId: r.examId,
    examinerId: r.examinerId,
    examinerName: examiner?.name ?? '',
    role: examiner?.role ?? 'resident',
    teamId: r.teamId,
    examinedAt: new Date(r.at).toISOString(),
    heightCm: pointHeight(r),
    inclinationDeg: r.inclinationDeg,
    vein: r.vein,
    category: categoryOfReading(r),
    elevated: elevatedOfReading(r) === true,
  })
}

/** One page of point pairs (a measured height on both sides) as the API shows them, with the patient code as the viewer may see it. */
export function presentPairs(pairs: Pair[], examiners: Map<string, Examiner>, codeOf: (pair: Pair) => string): AgreementPair[] {
  return pairs.map((pair) => {
    const { first, second } = pair
    return {
      patientCode: codeOf(pair),
      order: pair.order,
      differenceCm: pointHeight(first) - pointHeight(second),
      meanCm: (pointHeight(first) + pointHeight(second)) / 2,
      minutesApart: Math.abs(second.at - first.at) / 60_000,
      first: readingOf(first, examiners.get(first.examinerId)),
      second: readingOf(second, examiners.get(second.examinerId)),
    }
  })
}
