/**
 * The estimate the first rules stored for the worked example (h 4 cm at 45°, ruler, incline-adjusted) with the local
 * observer term then in use: one category from the point value, hints, a soft venous-sign warning, no settings version.
 */
export const FIRST_RULES_ESTIMATE = {
  cvpCmH2O: 13.7,
  cvpMmHg: 10.077152,
  bandCmH2O: [10.6784, 16.7216],
  bandMmHg: [7.854443, 12.29986],
  offsetCm: 9.7,
  offsetModel: 'incline-adjusted',
  heightCm: 4,
  sigmaCm: 1.5416,
  bound: 'point',
  elevated: true,
  category: 'high',
  confidence: 'indeterminate',
  observerSource: 'local',
  outsideStudiedRange: false,
  venousSignCount: 3,
  mayBeArterial: false,
  hints: [{ code: 'large-v-waves', finding: 'Large v waves', consider: 'tricuspid regurgitation' }],
  caution: 'Estimate from physical examination, with a wide error band.',
}
