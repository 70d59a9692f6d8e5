import type { QueryInterface } from 'sequelize'
import { dropTrigger, setOnceTrigger } from '../triggers.ts'

const TRIGGER = 'signatures_supersede_only'
const MESSAGE = 'signatures are append-only: only supersededAt may be set, once'
// What 2026.12.04T09.00.00.supervision listed, written out so this migration's down keeps restoring that trigger.
const FIRST_COLUMNS = ['id', 'examId', 'examVersion', 'signerId', 'signerName', 'meaning', 'signedAt', 'content', 'contentHash']
// The attending's reading and the feedback, added by 2026.12.11T11.00.00.references after the trigger was made.
const LATER_COLUMNS = ['readingExamId', 'feedback', 'feedbackText']
const ALL_COLUMNS = [...FIRST_COLUMNS, ...LATER_COLUMNS]

/** Refuses to run on a signatures table whose columns are not the ones the new trigger lists. */
async function checkColumns(q: QueryInterface): Promise<void> {
  const stored = Object.keys(await q.describeTable('signatures')).filter((c) => c !== 'supersededAt')
  if ([...stored].sort().join() !== [...ALL_COLUMNS].sort().join())
    throw new Error(`signatures has columns ${stored.join(', ')}; the set-once trigger would list ${ALL_COLUMNS.join(', ')}`)
}

const recreate = async (q: QueryInterface, unchanged: readonly string[]) => {
  await dropTrigger(q, 'signatures', TRIGGER)
  await setOnceTrigger(q, { name: TRIGGER, table: 'signatures', column: 'supersededAt', unchanged, message: MESSAGE })
}

/**
 * Superseding a signature must leave everything else of it as it was (21 CFR 11.10(e), 11.70), the attending's reading
 * and feedback included: the set-once trigger lists every column but `supersededAt`.
 */
export async function up(q: QueryInterface): Promise<void> {
  await checkColumns(q)
  await recreate(q, ALL_COLUMNS)
}

export async function down(q: QueryInterface): Promise<void> {
  await recreate(q, FIRST_COLUMNS)
}
