import { meanSquares, type MeanSquares } from './icc-anova.ts'
import { average, fLimits, single, spearmanBrown } from './icc-limits.ts'
import { fQuantile } from './quantiles.ts'
import { degenerate, type Interval, type StatResult } from './result.ts'
import { assertRectangular } from './validate.ts'

/** One intraclass correlation with its 95% confidence interval. */
export type IccEstimate = { value: number; ci: Interval }

/**
 * The six Shrout & Fleiss (1979) forms, named as in R's psych::ICC.
 * icc2 is ICC(2,1), McGraw & Wong's ICC(A,1): two-way random, absolute agreement, single rater.
 */
export type IccForms = {
  /** ICC(1,1): one-way random, single rater. */
  icc1: IccEstimate
  /** ICC(2,1) = ICC(A,1): two-way random, absolute agreement, single rater. */
  icc2: IccEstimate
  /** ICC(3,1) = ICC(C,1): two-way mixed, consistency, single rater. */
  icc3: IccEstimate
  /** ICC(1,k): one-way random, mean of k raters. */
  icc1k: IccEstimate
  /** ICC(2,k) = ICC(A,k): two-way random, absolute agreement, mean of k raters. */
  icc2k: IccEstimate
  /** ICC(3,k) = ICC(C,k): two-way mixed, consistency, mean of k raters. */
  icc3k: IccEstimate
}

export type Icc = StatResult<{ n: number; k: number } & IccForms>

const P = 0.975

/** ICC(2,1)'s CI with Satterthwaite's df (Shrout & Fleiss 1979; McGraw & Wong 1996), as R's psych::ICC computes it. */
function agreementCi({ n, k, rows, columns, error }: MeanSquares, r: number): Interval {
  const b = n * (1 + (k - 1) * r) - k * r
  const vd = (n - 1) * (k * r * columns) ** 2 + (b * error) ** 2
  // With no residual variance the df tend to k − 1; any finite df then gives the limits 1.
  const v = vd === 0 ? k - 1 : ((k - 1) * (n - 1) * (k * r * columns + b * error) ** 2) / vd
  const fu = fQuantile(P, n - 1, v)
  const fl = fQuantile(P, v, n - 1)
  const c = k * columns + (k * n - k - n) * error
  // A tiny v (strongly negative ICC) overflows the F quantile; the lower limit then tends to −n·MSE/c.
  const low = fu === Infinity ? (-n * error) / c : (n * (rows - fu * error)) / (fu * c + n * rows)
  return [low, (n * (fl * rows - error)) / (c + n * fl * rows)]
}

/**
 * ICC(1,1), (2,1), (3,1) and their k-rater forms for an n×k matrix (rows are subjects, columns raters),
 * each with its F-based 95% CI, following Shrout & Fleiss 1979 and McGraw & Wong 1996 as R's psych::ICC does.
 */
export function icc(ratings: readonly (readonly number[])[]): Icc {
  const k = assertRectangular(ratings, 'ratings')
  const n = ratings.length
  if (n < 2) return degenerate('Needs at least 2 subjects')
  if (k < 2) return degenerate('Needs at least 2 raters')
  const ms = meanSquares(ratings)
  if (ms.totalSumOfSquares === 0) return degenerate('All ratings are identical')
  if (ms.rows === 0) return degenerate('Subjects do not differ, so the ICC is undefined')

  const { rows, columns, error, within } = ms
  const df1 = n - 1
  const f1 = fLimits(rows / within, df1, n * (k - 1))
  const f3 = fLimits(rows / error, df1, (n - 1) * (k - 1))
  const r2 = (rows - error) / (rows + (k - 1) * error + (k * (columns - error)) / n)
  const ci2 = agreementCi(ms, r2)
  const forms: IccForms = {
    icc1: { value: (rows - within) / (rows + (k - 1) * within), ci: [single(f1[0], k), single(f1[1], k)] },
    icc2: { value: r2, ci: ci2 },
    icc3: { value: (rows - error) / (rows + (k - 1) * error), ci: [single(f3[0], k), single(f3[1], k)] },
    icc1k: { value: (rows - within) / rows, ci: [average(f1[0]), average(f1[1])] },
    icc2k: { value: spearmanBrown(r2, k), ci: [spearmanBrown(ci2[0], k), spearmanBrown(ci2[1], k)] },
    icc3k: { value: (rows - error) / rows, ci: [average(f3[0]), average(f3[1])] },
  }
  const finite = Object.values(forms).every((f) => [f.value, ...f.ci].every(Number.isFinite))
  return finite ? { ok: true, n, k, ...forms } : degenerate('The ICC is undefined for these ratings')
}
