import { StatsInputError } from './result.ts'

export const LANDIS_KOCH_LABELS = ['poor', 'slight', 'fair', 'moderate', 'substantial', 'almost perfect'] as const
export type LandisKochLabel = (typeof LANDIS_KOCH_LABELS)[number]

/**
 * Landis & Koch (1977, Biometrics 33:159–174) strength-of-agreement label for a kappa, on half-open
 * intervals: < 0 poor, [0, 0.2) slight, [0.2, 0.4) fair, [0.4, 0.6) moderate, [0.6, 0.8) substantial,
 * [0.8, 1] almost perfect.
 */
export function landisKoch(kappa: number): LandisKochLabel {
  if (!Number.isFinite(kappa) || kappa > 1) throw new StatsInputError(`kappa must be a finite number ≤ 1, got ${kappa}`)
  if (kappa < 0) return 'poor'
  if (kappa < 0.2) return 'slight'
  if (kappa < 0.4) return 'fair'
  if (kappa < 0.6) return 'moderate'
  if (kappa < 0.8) return 'substantial'
  return 'almost perfect'
}
