import { blandAltman, cohenKappa, iccOneWay, landisKoch, weightedKappa } from '#shared/stats/index'
import type { AgreementSummary, ExaminerAgreement } from '#shared/schemas/agreement'
import type { Examiner } from './examiners.ts'
import type { Pair, Reading } from './pairs.ts'
import { CATEGORY_SCALE, categoryOfReading, isElevated } from './reading-categories.ts'

const MIN_PAIRS = 2
const ROLE_ORDER: Record<Examiner['role'], number> = { resident: 0, attending: 1 }

const unavailable = (reason: string) => ({ unavailable: reason })
const heights = (readings: Reading[]) => readings.map((r) => r.heightCm)

/** k×k counts: rows are the first reading's level, columns the second's. */
function table(pairs: Pair[], level: (r: Reading) => number, k: number): number[][] {
  const counts = Array.from({ length: k }, () => new Array<number>(k).fill(0))
  for (const { first, second } of pairs) counts[level(first)]![level(second)]! += 1
  return counts
}

function blandAltmanOf(first: number[], second: number[]): AgreementSummary['blandAltman'] {
  const r = blandAltman(first, second)
  return r.ok ? { bias: r.bias, sd: r.sd, loa: r.loa, biasCi: r.biasCi, loaCi: r.loaCi } : unavailable(r.reason)
}

/**
 * ICC(1,1), one-way random effects (Shrout & Fleiss 1979, case 1): each patient is read by its own pair of examiners,
 * so no examiner effect can be separated out. Calibration rounds, fully crossed, keep ICC(2,1).
 */
function iccOf(first: number[], second: number[]): AgreementSummary['icc'] {
  const r = iccOneWay(first.map((a, i) => [a, second[i]!]))
  return r.ok ? { value: r.value, ci: r.ci } : unavailable(r.reason)
}

function kappaElevatedOf(pairs: Pair[]): AgreementSummary['kappaElevated'] {
  const r = cohenKappa(table(pairs, (x) => (isElevated(x) ? 1 : 0), 2))
  return r.ok ? { value: r.value, label: landisKoch(r.value) } : unavailable(r.reason)
}

function kappaCategoryOf(pairs: Pair[]): AgreementSummary['kappaCategory'] {
  const counts = table(pairs, (x) => CATEGORY_SCALE.indexOf(categoryOfReading(x)), CATEGORY_SCALE.length)
  const linear = weightedKappa(counts, 'linear')
  const quadratic = weightedKappa(counts, 'quadratic')
  if (!linear.ok) return unavailable(linear.reason)
  if (!quadratic.ok) return unavailable(quadratic.reason)
  return { linear: linear.value, quadratic: quadratic.value, label: landisKoch(linear.value) }
}

/** Each examiner's own reading against their partner's; `focus` keeps only that examiner. */
export function byExaminer(pairs: Pair[], examiners: Map<string, Examiner>, focus?: string): ExaminerAgreement[] {
  const sides = new Map<string, { own: number[]; partner: number[] }>()
  const add = (own: Reading, partner: Reading) => {
    const side = sides.get(own.examinerId) ?? sides.set(own.examinerId, { own: [], partner: [] }).get(own.examinerId)!
    side.own.push(own.heightCm)
    side.partner.push(partner.heightCm)
  }
  for (const { first, second } of pairs) {
    add(first, second)
    add(second, first)
  }
  const ids = focus === undefined ? [...sides.keys()] : [focus].filter((id) => sides.has(id))
  return ids
    .map((examinerId) => {
      const { own, partner } = sides.get(examinerId)!
      const who = examiners.get(examinerId) ?? { name: '', role: 'resident' as const }
      const r = blandAltman(own, partner)
      const stats = r.ok ? { bias: r.bias, sd: r.sd, loa: r.loa } : { bias: own[0]! - partner[0]!, sd: null, loa: null }
      return { examinerId, name: who.name, role: who.role, n: own.length, ...stats }
    })
    .sort((a, b) => ROLE_ORDER[a.role] - ROLE_ORDER[b.role] || a.name.localeCompare(b.name) || a.examinerId.localeCompare(b.examinerId))
}

/** Bland–Altman, ICC(1,1) and kappas over pairs, in the difference's order; too few pairs → the reason, never NaN. */
export function summarize(pairs: Pair[], examiners: Map<string, Examiner>, focus?: string): AgreementSummary {
  const n = pairs.length
  const rows = byExaminer(pairs, examiners, focus)
  if (n < MIN_PAIRS) {
    const reason = unavailable(`Needs at least ${MIN_PAIRS} pairs; ${n === 0 ? 'none match' : 'only 1 matches'}`)
    return { n, blandAltman: reason, icc: reason, kappaElevated: reason, kappaCategory: reason, byExaminer: rows }
  }
  const first = heights(pairs.map((p) => p.first))
  const second = heights(pairs.map((p) => p.second))
  return {
    n,
    blandAltman: blandAltmanOf(first, second),
    icc: iccOf(first, second),
    kappaElevated: kappaElevatedOf(pairs),
    kappaCategory: kappaCategoryOf(pairs),
    byExaminer: rows,
  }
}
