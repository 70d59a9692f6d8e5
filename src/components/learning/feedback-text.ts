import { oneDp } from '#shared/domain/number-text'

/** The resident's estimate minus the attending's, with which way it points, e.g. "+2.1 cmH₂O (the resident read higher)". */
export function differenceText(differenceCmH2O: number | null, who = 'the resident'): string {
  if (differenceCmH2O === null) return 'No difference to take: one of the readings is a bound or has no estimate'
  const value = `${differenceCmH2O > 0 ? '+' : differenceCmH2O < 0 ? '−' : ''}${oneDp(Math.abs(differenceCmH2O))} cmH₂O`
  if (Number(oneDp(Math.abs(differenceCmH2O))) === 0) return `${value} (the same)`
  return `${value} (${who} read ${differenceCmH2O > 0 ? 'higher' : 'lower'})`
}
