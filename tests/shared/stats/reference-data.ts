// Published data sets the statistics are checked against; each names where it was taken from.

/** Shrout & Fleiss 1979 (Psychol Bull 86:420–428), worked example: 6 targets × 4 judges. */
export const SHROUT_FLEISS_1979 = [
  [9, 2, 5, 8],
  [6, 1, 3, 2],
  [8, 4, 6, 8],
  [7, 1, 2, 6],
  [10, 5, 6, 9],
  [6, 2, 4, 7],
]

/** Bland & Altman 1986 (Lancet i:307–310), peak expiratory flow (l/min), first reading of each meter. */
export const PEAK_FLOW_1986 = {
  wright: [494, 395, 516, 434, 476, 557, 413, 442, 650, 433, 417, 656, 267, 478, 178, 423, 427],
  miniWright: [512, 430, 520, 428, 500, 600, 364, 380, 658, 445, 432, 626, 260, 477, 259, 350, 451],
}

/** The SAS 3×3 example reproduced in statsmodels' stats/tests/test_inter_rater.py (`table10`). */
export const SAS_3X3 = [
  [0, 4, 1],
  [0, 8, 0],
  [0, 1, 5],
]

/**
 * R irr's `anxiety` data, raters 2 and 3 (20 subjects, scale 1–6), as listed in statsmodels'
 * stats/tests/test_inter_rater.py.
 */
export const IRR_ANXIETY = {
  rater2: [3, 6, 4, 6, 2, 4, 2, 4, 3, 3, 2, 3, 3, 3, 2, 2, 1, 3, 3, 4],
  rater3: [2, 1, 4, 4, 3, 2, 1, 6, 1, 1, 1, 2, 3, 3, 1, 1, 3, 3, 2, 2],
}

/**
 * Fleiss 1971 (Psychol Bull 76:378–382): 30 patients × 6 psychiatrists, 5 diagnoses
 * (1 depression, 2 personality disorder, 3 schizophrenia, 4 neurosis, 5 other); R irr's `diagnoses`,
 * as listed in statsmodels' stats/tests/test_inter_rater.py.
 */
export const FLEISS_1971_DIAGNOSES = [
  [4, 4, 4, 4, 4, 4], [2, 2, 2, 5, 5, 5], [2, 3, 3, 3, 3, 5], [5, 5, 5, 5, 5, 5], [2, 2, 2, 4, 4, 4],
  [1, 1, 3, 3, 3, 3], [3, 3, 3, 3, 5, 5], [1, 1, 3, 3, 3, 4], [1, 1, 4, 4, 4, 4], [5, 5, 5, 5, 5, 5],
  [1, 4, 4, 4, 4, 4], [1, 2, 4, 4, 4, 4], [2, 2, 2, 3, 3, 3], [1, 4, 4, 4, 4, 4], [2, 2, 4, 4, 4, 5],
  [3, 3, 3, 3, 3, 5], [1, 1, 1, 4, 5, 5], [1, 1, 1, 1, 1, 2], [2, 2, 4, 4, 4, 4], [1, 3, 3, 5, 5, 5],
  [5, 5, 5, 5, 5, 5], [2, 4, 4, 4, 4, 4], [2, 2, 4, 5, 5, 5], [1, 1, 4, 4, 4, 4], [1, 4, 4, 4, 4, 5],
  [2, 2, 2, 2, 2, 4], [1, 1, 1, 1, 5, 5], [2, 2, 4, 4, 4, 4], [1, 3, 3, 3, 3, 3], [5, 5, 5, 5, 5, 5],
]

/** Wikipedia's "Fleiss' kappa" worked example (10 subjects × 14 raters, 5 categories), as in statsmodels' tests. */
export const WIKIPEDIA_FLEISS = [
  [0, 0, 0, 0, 14],
  [0, 2, 6, 4, 2],
  [0, 0, 3, 5, 6],
  [0, 3, 9, 2, 0],
  [2, 2, 8, 1, 1],
  [7, 7, 0, 0, 0],
  [3, 2, 6, 3, 0],
  [2, 5, 3, 2, 2],
  [6, 5, 2, 1, 0],
  [0, 2, 2, 3, 7],
]
