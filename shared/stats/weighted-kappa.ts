import { kappaFromTable, type DisagreementWeight, type Kappa } from './cohen-kappa.ts'

export const KAPPA_WEIGHTINGS = ['linear', 'quadratic'] as const
export type KappaWeighting = (typeof KAPPA_WEIGHTINGS)[number]

const weights: Record<KappaWeighting, DisagreementWeight> = {
  linear: (i, j, k) => Math.abs(i - j) / (k - 1),
  quadratic: (i, j, k) => ((i - j) / (k - 1)) ** 2,
}

/**
 * Weighted kappa (Cohen 1968) over the table's full ordered scale: a k×k table declares k categories
 * even when some are never used, so distances between categories do not shrink when a level is absent.
 * Linear weights |i − j|/(k − 1); quadratic ((i − j)/(k − 1))² (Fleiss & Cohen 1973).
 */
export function weightedKappa(table: readonly (readonly number[])[], weighting: KappaWeighting): Kappa {
  return kappaFromTable(table, weights[weighting])
}
