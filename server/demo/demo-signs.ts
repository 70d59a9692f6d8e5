import type { VenousSigns } from '#shared/schemas/exam'

/** The venous signs of a typical demo exam: four of Cook & Simel's signs (JAMA 1996;275:630–634) found, two not tried. */
export const VENOUS_SIGNS_SEEN: VenousSigns = {
  'not-palpable': 'present',
  'double-peaked': 'present',
  'falls-on-inspiration': 'present',
  'changes-with-position': 'not-tested',
  'rises-with-abdominal-pressure': 'not-tested',
  'obliterated-by-light-pressure': 'present',
}
