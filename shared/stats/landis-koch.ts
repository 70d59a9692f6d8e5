import { StatsInputError } from './result.ts'

export const LANDIS_KOCH_LABELS = ['poor', 'slight', 'fair', 'moderate', 'substantial', 'almost perfect'] as const
export type LandisKochLabel = (typeof LANDIS_KOCH_LABELS)[number]

/** Upper limit of each band after "poor", closed at the top. */
const UPPER_LIMITS: readonly [number, LandisKochLabel][] = [
  [0.2, 'slight'],
  [0.4, 'fair'],
  [0.6, 'moderate'],
  [0.8, 'substantial'],
]

/**
 * Landis & Koch (1977, Biometrics 33:159–174) strength-of-agreement label for a kappa. Their table closes each band at
 * the top: < 0 poor, 0–0.20 slight, 0.21–0.40 fair, 0.41–0.60 moderate, 0.61–0.80 substantial, 0.81–1.00 almost
 * perfect, read here as [0, 0.20], (0.20, 0.40], (0.40, 0.60], (0.60, 0.80], (0.80, 1].
 */
export function landisKoch(kappa: number): LandisKochLabel {
  if (!Number.isFinite(kappa) || kappa > 1 + 1e-9) throw new StatsInputError(`kappa must be a finite number ≤ 1, got ${kappa}`)
  // A kappa whose exact value is a limit (e.g. 0.4 from a 2×2 table) may arrive as 0.4000000000000001.
  const value = Math.round(kappa * 1e9) / 1e9
  if (value < 0) return 'poor'
  return UPPER_LIMITS.find(([limit]) => value <= limit)?.[1] ?? 'almost perfect'
}
