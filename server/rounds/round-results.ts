import { fleissKappa, icc, landisKoch } from '#shared/stats/index'
import type { RoundMissingEntry, RoundPerson, RoundResults } from '#shared/schemas/round'

/** One examiner's reading of one patient code: a measured height, or null when the exam has none (column not seen). */
export type RoundReadings = Map<string, number | null>

export const cellKey = (examinerId: string, patientCode: string) => `${examinerId}\u0000${patientCode}`

const MIN_SUBJECTS = 2
const unavailable = (reason: string) => ({ unavailable: reason })
const mean = (xs: readonly number[]) => xs.reduce((a, b) => a + b, 0) / xs.length

function sampleSd(xs: readonly number[]): number | null {
  if (xs.length < 2) return null
  const m = mean(xs)
  return Math.sqrt(xs.reduce((acc, x) => acc + (x - m) ** 2, 0) / (xs.length - 1))
}

export type RoundStatistics = Pick<
  RoundResults,
  'subjects' | 'raters' | 'completeSubjects' | 'incompleteCodes' | 'missing' | 'icc' | 'fleissElevated' | 'elevatedAboveCm' | 'byExaminer' | 'heights'
>

/**
 * The round's agreement with examiners as raters and patient codes as subjects: ICC(2,1) over k raters with its
 * 95% CI, Fleiss' kappa on elevated (h > threshold) / not elevated, and each examiner's mean deviation from the
 * subject's mean of all examiners. The ICC and kappa need every rater on every subject, so a patient code with any
 * missing entry is left out of all three and reported; too few complete subjects give a reason, never NaN.
 */
export function roundStatistics(
  patientCodes: readonly string[],
  examiners: readonly RoundPerson[],
  readings: RoundReadings,
  elevatedAboveCm: number,
): RoundStatistics {
  const heights = patientCodes.map((code) => examiners.map((e) => readings.get(cellKey(e.id, code)) ?? null))
  const missing: RoundMissingEntry[] = []
  patientCodes.forEach((code) =>
    examiners.forEach((e) => {
      const key = cellKey(e.id, code)
      if (readings.get(key) === undefined) missing.push({ examinerId: e.id, examinerName: e.displayName, patientCode: code, reason: 'not-recorded' })
      else if (readings.get(key) === null) missing.push({ examinerId: e.id, examinerName: e.displayName, patientCode: code, reason: 'not-measured' })
    }),
  )
  const complete = heights.filter((row): row is number[] => row.every((h) => h !== null))
  const incompleteCodes = patientCodes.filter((_, i) => heights[i]!.some((h) => h === null))
  const k = examiners.length
  const tooFew = unavailable(
    `Needs at least ${MIN_SUBJECTS} patient codes measured by every examiner; ${complete.length === 0 ? 'none is' : 'only 1 is'}`,
  )

  let iccResult: RoundResults['icc'] = tooFew
  let kappa: RoundResults['fleissElevated'] = tooFew
  if (complete.length >= MIN_SUBJECTS && k >= 2) {
    const r = icc(complete)
    iccResult = r.ok ? { value: r.icc2.value, ci: r.icc2.ci } : unavailable(r.reason)
    const counts = complete.map((row) => {
      const elevated = row.filter((h) => h > elevatedAboveCm).length
      return [elevated, row.length - elevated]
    })
    const f = fleissKappa(counts)
    kappa = f.ok ? { value: f.value, label: landisKoch(f.value) } : unavailable(f.reason)
  }

  const subjectMeans = complete.map(mean)
  const byExaminer = examiners.map((e, j) => {
    const deviations = complete.map((row, i) => row[j]! - subjectMeans[i]!)
    return {
      examinerId: e.id,
      name: e.displayName,
      n: deviations.length,
      bias: deviations.length ? mean(deviations) : null,
      sd: sampleSd(deviations),
    }
  })

  return {
    subjects: patientCodes.length,
    raters: k,
    completeSubjects: complete.length,
    incompleteCodes,
    missing: { count: missing.length, entries: missing },
    icc: iccResult,
    fleissElevated: kappa,
    elevatedAboveCm,
    byExaminer,
    heights,
  }
}
