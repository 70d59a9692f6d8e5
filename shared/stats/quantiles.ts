/// <reference path="./jstat.d.ts" />
import jStat from 'jstat'

/** The p-quantile of Student's t with `df` degrees of freedom (df may be fractional). */
export function tQuantile(p: number, df: number): number {
  return jStat.studentt.inv(p, df)
}

/** The p-quantile of the F distribution with (df1, df2) degrees of freedom (fractional allowed). */
export function fQuantile(p: number, df1: number, df2: number): number {
  return jStat.centralF.inv(p, df1, df2)
}

/** The p-quantile of the χ² distribution with `df` degrees of freedom. */
export function chiSquareQuantile(p: number, df: number): number {
  return jStat.chisquare.inv(p, df)
}
