import type { PairOrder } from '#shared/schemas/agreement'

/** §6: two exams of one patient by different examiners at most this far apart form a pair. */
export const DEFAULT_PAIR_WINDOW_MINUTES = 120

/** One measured exam as pairing needs it: a non-draft with the column top seen and a height (bound 'point'). */
export interface Reading {
  /** Equal for readings of one patient code (an ordinal within one load, cheaper to compare than the code). */
  patient: number
  patientCode: string
  /** The exam's SQLite rowid, to fetch its details for a page of pairs. */
  rowid: number
  examinerId: string
  teamId: string
  /** examinedAt in epoch milliseconds. */
  at: number
  heightCm: number
  cvpCmH2O: number
  /** Trunk inclination and vein, for the agreement filters. */
  inclinationDeg: number
  vein: string
}

/** Two readings of one patient; the difference is first.heightCm − second.heightCm. */
export interface Pair {
  first: Reading
  second: Reading
  order: PairOrder
}

export interface PairingOptions {
  windowMinutes: number
  isAttending: (examinerId: string) => boolean
}

function orient(earlier: Reading, later: Reading, isAttending: (id: string) => boolean): Pair {
  const earlierAttends = isAttending(earlier.examinerId)
  if (earlierAttends !== isAttending(later.examinerId)) {
    const [first, second] = earlierAttends ? [later, earlier] : [earlier, later]
    return { first, second, order: 'resident-minus-attending' }
  }
  return { first: earlier, second: later, order: 'earlier-minus-later' }
}

// Most patients have two readings; this skips the candidate list.
function pairTwo(earlier: Reading, later: Reading, windowMs: number, options: PairingOptions, out: Pair[]): void {
  if (later.examinerId !== earlier.examinerId && later.at - earlier.at <= windowMs) out.push(orient(earlier, later, options.isAttending))
}

/** Nearest in time first, each exam in at most one pair; ties go to the earlier exam. */
function pairGroup(group: Reading[], windowMs: number, options: PairingOptions, out: Pair[]): void {
  const candidates: [gap: number, i: number, j: number][] = []
  for (let i = 0; i < group.length; i++) {
    for (let j = i + 1; j < group.length && group[j]!.at - group[i]!.at <= windowMs; j++) {
      if (group[j]!.examinerId !== group[i]!.examinerId) candidates.push([group[j]!.at - group[i]!.at, i, j])
    }
  }
  if (candidates.length > 1) candidates.sort((a, b) => a[0] - b[0] || a[1] - b[1] || a[2] - b[2])
  const used = new Set<number>()
  for (const [, i, j] of candidates) {
    if (used.has(i) || used.has(j)) continue
    used.add(i).add(j)
    out.push(orient(group[i]!, group[j]!, options.isAttending))
  }
}

const before = (a: Reading, b: Reading) => a.patient - b.patient || a.at - b.at || a.rowid - b.rowid

/** Pairs readings in one linear scan over them in order of patient and time; they are sorted first if they are not. */
export function pairReadings(readings: Reading[], options: PairingOptions): Pair[] {
  const sorted = readings.every((r, i) => i === 0 || before(readings[i - 1]!, r) <= 0) ? readings : [...readings].sort(before)
  const windowMs = options.windowMinutes * 60_000
  const pairs: Pair[] = []
  let start = 0
  for (let end = 1; end <= sorted.length; end++) {
    if (end < sorted.length && sorted[end]!.patient === sorted[start]!.patient) continue
    if (end - start === 2) pairTwo(sorted[start]!, sorted[start + 1]!, windowMs, options, pairs)
    else if (end - start > 2) pairGroup(sorted.slice(start, end), windowMs, options, pairs)
    start = end
  }
  return pairs
}
