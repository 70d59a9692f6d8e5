import type { AccuracySummary } from '#shared/schemas/reference'

/** Where 95% falls against the coverage's Wilson 95% interval: inside it, or the whole interval below or above. */
export type CoverageVerdict = 'honest' | 'narrow' | 'wide'

const NOMINAL = 0.95

export function coverageVerdict(ci: readonly [number, number]): CoverageVerdict {
  if (ci[1] < NOMINAL) return 'narrow'
  if (ci[0] > NOMINAL) return 'wide'
  return 'honest'
}

const VERDICT_TEXT: Record<CoverageVerdict, string> = {
  honest: 'consistent with an honest 95% band',
  narrow: 'narrower than it should be',
  wide: 'wider than it needs to be',
}

const percent = (share: number) => `${Math.round(share * 100)}%`

/** The coverage in one sentence: how often the band held the measured value, and what that says of the band. */
export function coverageSentence(coverage: AccuracySummary['coverage']): string {
  const { inside, n, share, ci } = coverage
  if (!n || share === null || !ci) return 'No measured reference lies within the window of an exam yet: the band’s coverage cannot be judged.'
  const exams = n === 1 ? 'exam' : 'exams'
  return (
    `The band held the measured value in ${inside} of ${n} ${exams}: ${VERDICT_TEXT[coverageVerdict(ci)]} ` +
    `(${percent(share)}, 95% CI ${percent(ci[0])} to ${percent(ci[1])}, against the 95% a band should hold).`
  )
}
