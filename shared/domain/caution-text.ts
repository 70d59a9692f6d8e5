import type { EstimateSettings } from '../schemas/settings.ts'
import { FIXED_OFFSET_CM } from './offset.ts'
import { shortNumber as n } from './number-text.ts'

function topText(heightCm: number): string {
  return heightCm < 0 ? `top ${n(-heightCm)} cm below the sternal angle` : `top ${n(heightCm)} cm above the sternal angle`
}

/**
 * Why "elevated" and the category disagree, in numbers: the height rule assumes the classical 5 cm offset, the
 * estimate uses the CT-derived one at this inclination. Ends without a full stop, for the source to follow.
 */
export function frameNoteText(heightCm: number, cvpCmH2O: number, elevated: boolean, deg: number, sethCm: number, s: EstimateSettings): string {
  const rule = n(s.elevatedAboveCm)
  const cvp = `the estimated CVP, ${n(cvpCmH2O)} cmH₂O, is ${elevated ? 'not above' : 'above'} ${n(s.highAboveCmH2O)} cmH₂O`
  const head = `JVP ${elevated ? 'elevated' : 'not elevated'} (${topText(heightCm)}, ${elevated ? 'more' : 'not more'} than ${rule} cm) while ${cvp}`
  const classical = `a top ${rule} cm above the sternal angle is ${n(s.elevatedAboveCm + FIXED_OFFSET_CM)} cmH₂O`
  const frame = `the ${rule} cm rule assumes the classical ${FIXED_OFFSET_CM} cm offset, in which ${classical}`
  return `${head}: ${frame}, and at ${n(deg)}° the CT-derived offset is ${n(sethCm)} cm`
}

/** The few-venous-signs warning, naming the setting's number; ends without a full stop. */
export function venousShortfallText(count: number, required: number, setting: number): string {
  const recorded = count === 0 ? 'No venous sign was' : count === 1 ? 'Only 1 venous sign was' : `Only ${count} venous signs were`
  const expected =
    required < setting
      ? `fewer than the ${required} that can be present with this rhythm or breathing pattern (the setting asks for ${setting})`
      : `fewer than the ${setting} required`
  return `${recorded} recorded present, ${expected}: the pulsation may be arterial`
}
