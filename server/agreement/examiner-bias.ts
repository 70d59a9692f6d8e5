import { blandAltmanFromSums, type DifferenceSums } from '#shared/stats/index'
import type { ExaminerAgreement } from '#shared/schemas/agreement'
import type { Examiner } from './examiners.ts'
import type { PairGroup } from './pair-groups.ts'

const ROLE_ORDER: Record<Examiner['role'], number> = { resident: 0, attending: 1 }

/**
 * Each examiner's own reading against their partner's (own − partner's), over point-pair groups; `focus` keeps only
 * that examiner. A group's Σ(earlier − later) is the earlier examiner's own − partner's and, negated, the later one's;
 * the squares are the same for both.
 */
export function byExaminer(points: readonly PairGroup[], examiners: Map<string, Examiner>, focus?: string): ExaminerAgreement[] {
  const sides = new Map<string, DifferenceSums>()
  const add = (examinerId: string, n: number, sum: number, sumOfSquares: number) => {
    const side = sides.get(examinerId) ?? { n: 0, sum: 0, sumOfSquares: 0 }
    sides.set(examinerId, { n: side.n + n, sum: side.sum + sum, sumOfSquares: side.sumOfSquares + sumOfSquares })
  }
  for (const g of points) {
    add(g.earlierExaminerId, g.n, g.sumDifference, g.sumDifferenceSquares)
    add(g.laterExaminerId, g.n, -g.sumDifference, g.sumDifferenceSquares)
  }
  const ids = focus === undefined ? [...sides.keys()] : [focus].filter((id) => sides.has(id))
  return ids
    .map((examinerId) => {
      const sums = sides.get(examinerId)!
      const who = examiners.get(examinerId) ?? { name: '', role: 'resident' as const }
      const r = blandAltmanFromSums(sums)
      // One pair has a difference but no spread.
      const stats = r.ok ? { bias: r.bias, sd: r.sd, loa: r.loa } : { bias: sums.sum, sd: null, loa: null }
      return { examinerId, name: who.name, role: who.role, n: sums.n, ...stats }
    })
    .sort((a, b) => ROLE_ORDER[a.role] - ROLE_ORDER[b.role] || a.name.localeCompare(b.name) || a.examinerId.localeCompare(b.examinerId))
}
