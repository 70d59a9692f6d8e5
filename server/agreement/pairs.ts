import type { PairOrder } from '#shared/schemas/agreement'

/** The column tops that pair: a point height and the two bounds. */
export const PAIR_COLUMN_TOPS = ['seen', 'above-neck', 'not-filled'] as const
export type PairColumnTop = (typeof PAIR_COLUMN_TOPS)[number]

/**
 * One exam as pairing needs it: a non-draft whose column top was seen (a point height), above the neck (a lower bound:
 * the height of the highest visible point of the neck) or not filled even lying flat (an upper bound, no height).
 */
export interface Reading {
  examId: string
  patientCode: string
  examinerId: string
  teamId: string
  /** examinedAt in epoch milliseconds. */
  at: number
  /** h: the column top's height for `seen`, the lower bound's for `above-neck`; null for `not-filled`. */
  heightCm: number | null
  /** The estimate for `seen`; the bound's own limit (h + offset, or the offset alone) for the bounds. */
  cvpCmH2O: number
  /** Trunk inclination and vein, for the agreement filters. */
  inclinationDeg: number
  vein: string
  columnTop: PairColumnTop
}

/** Two readings of one patient in order of time, as `agreement_pairs` stores them. */
export interface ExamPair {
  earlier: Reading
  later: Reading
}

/** Two readings of one patient; the difference is first.heightCm − second.heightCm. */
export interface Pair {
  first: Reading
  second: Reading
  order: PairOrder
}

/**
 * The difference's order: resident − attending when exactly one of the two examiners is an attending, otherwise
 * earlier − later. Taken when the pairs are read, so that a change of an account's roles needs no pairing again.
 */
export function orient({ earlier, later }: ExamPair, isAttending: (examinerId: string) => boolean): Pair {
  if (isAttending(earlier.examinerId) !== isAttending(later.examinerId)) {
    const [first, second] = flips(earlier.examinerId, later.examinerId, isAttending) ? [later, earlier] : [earlier, later]
    return { first, second, order: 'resident-minus-attending' }
  }
  return { first: earlier, second: later, order: 'earlier-minus-later' }
}

/** Whether the later reading comes first in the difference: the attending examined first, a resident after. */
export const flips = (earlierExaminerId: string, laterExaminerId: string, isAttending: (examinerId: string) => boolean) =>
  isAttending(earlierExaminerId) && !isAttending(laterExaminerId)

/** Nearest in time first, each exam in at most one pair; ties go to the earlier exam. */
function pairGroup(group: Reading[], windowMs: number, out: ExamPair[]): void {
  const candidates: [gap: number, i: number, j: number][] = []
  for (let i = 0; i < group.length; i++) {
    for (let j = i + 1; j < group.length && group[j]!.at - group[i]!.at <= windowMs; j++) {
      if (group[j]!.examinerId !== group[i]!.examinerId) candidates.push([group[j]!.at - group[i]!.at, i, j])
    }
  }
  candidates.sort((a, b) => a[0] - b[0] || a[1] - b[1] || a[2] - b[2])
  const used = new Set<number>()
  for (const [, i, j] of candidates) {
    if (used.has(i) || used.has(j)) continue
    used.add(i).add(j)
    out.push({ earlier: group[i]!, later: group[j]! })
  }
}

const before = (a: Reading, b: Reading) => (a.patientCode < b.patientCode ? -1 : a.patientCode > b.patientCode ? 1 : a.at - b.at)

/**
 * Two exams of one patient by different examiners at most `windowMinutes` apart form a pair. Readings come in order
 * of patient code and time (equal times in the order given); they are sorted first if they are not.
 */
export function pairReadings(readings: readonly Reading[], windowMinutes: number): ExamPair[] {
  const sorted = readings.every((r, i) => i === 0 || before(readings[i - 1]!, r) <= 0) ? readings : [...readings].sort(before)
  const windowMs = windowMinutes * 60_000
  const pairs: ExamPair[] = []
  let start = 0
  for (let end = 1; end <= sorted.length; end++) {
    if (end < sorted.length && sorted[end]!.patientCode === sorted[start]!.patientCode) continue
    if (end - start > 1) pairGroup(sorted.slice(start, end), windowMs, pairs)
    start = end
  }
  return pairs
}
