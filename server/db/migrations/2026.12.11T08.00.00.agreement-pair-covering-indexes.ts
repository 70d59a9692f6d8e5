import type { QueryInterface } from 'sequelize'

const TABLE = 'agreement_pairs'

/**
 * Covering indexes: each holds every column its readers touch, so the database answers them from the index alone,
 * whatever filters are set, instead of reading the whole row of each matching pair.
 * - `statistics`: the summary's one aggregate, grouped by examiner pair (`server/agreement/pair-groups.ts`), and the
 *   trend; every filter column (time, band, veins, teams) is in it.
 * - `time`: the walks in time order: the local error term's year of pairs, and the newest-first pairs list down to
 *   the page asked for (ordered by time, then by the first reading's exam id), a time range.
 */
const INDEXES: Record<string, string[]> = {
  agreement_pairs_statistics: [
    'earlierExaminerId', 'laterExaminerId', 'earlierColumnTop', 'laterColumnTop', 'earlierHeightCm', 'laterHeightCm',
    'earlierCvpCmH2O', 'laterCvpCmH2O', 'pairedAt', 'inclinationBand', 'earlierVein', 'laterVein', 'earlierTeamId', 'laterTeamId',
  ],
  agreement_pairs_time: [
    'pairedAt', 'earlierColumnTop', 'laterColumnTop', 'earlierHeightCm', 'laterHeightCm', 'earlierInclinationDeg',
    'laterInclinationDeg', 'earlierExaminerId', 'laterExaminerId', 'earlierExamId', 'laterExamId',
  ],
}

export async function up(q: QueryInterface): Promise<void> {
  for (const [name, fields] of Object.entries(INDEXES)) await q.addIndex(TABLE, fields, { name })
}

export async function down(q: QueryInterface): Promise<void> {
  for (const name of Object.keys(INDEXES).reverse()) await q.removeIndex(TABLE, name)
}
