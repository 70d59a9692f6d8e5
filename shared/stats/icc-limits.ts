import { fQuantile } from './quantiles.ts'

const P = 0.975

/** (F − 1)/(F + k − 1), taking its limit 1 when F is infinite (no error variance). */
export const single = (f: number, k: number) => (f === Infinity ? 1 : (f - 1) / (f + k - 1))
export const average = (f: number) => 1 - 1 / f
export const spearmanBrown = (r: number, k: number) => (k * r) / (1 + (k - 1) * r)

/** F-based 95% limits of F = MS_subjects/MS_error with (df1, df2) df (Shrout & Fleiss 1979, Psychol Bull 86:420–428). */
export function fLimits(f: number, df1: number, df2: number): [low: number, high: number] {
  return [f / fQuantile(P, df1, df2), f * fQuantile(P, df2, df1)]
}
