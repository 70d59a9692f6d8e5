import type { Degenerate } from '#shared/stats/result'

/** Narrows a statistic's result to its `ok` arm, failing the test with the stated reason otherwise. */
export function expectOk<T extends { ok: boolean }>(result: T | Degenerate): Exclude<T, Degenerate> {
  if (!result.ok) throw new Error(`expected a value, got: ${(result as Degenerate).reason}`)
  return result as Exclude<T, Degenerate>
}

/** Tallies raw ratings (subjects × raters, categories 1..k) into a subjects × categories count table. */
export function countsByCategory(ratings: readonly (readonly number[])[], k: number): number[][] {
  return ratings.map((row) => Array.from({ length: k }, (_, j) => row.filter((r) => r === j + 1).length))
}

/** Cross-tabulates two raters' ratings over the given ordered levels into a k×k table. */
export function crossTable(a: readonly number[], b: readonly number[], levels: readonly number[]): number[][] {
  const table = levels.map(() => levels.map(() => 0))
  a.forEach((x, i) => table[levels.indexOf(x)]![levels.indexOf(b[i]!)]!++)
  return table
}
