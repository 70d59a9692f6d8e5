import type { TeamRef } from '#shared/schemas/user'
import type { DraftFields } from '@/db/draft-schema'
import { lastChoices, rememberChoices } from '@/utils/bedside-memory'

/** Remembers the team and the angle on this device for the next patient (the quick screen offers them again). */
export function rememberThisExam(fields: DraftFields) {
  const angle = typeof fields.inclinationDeg === 'number' ? fields.inclinationDeg : undefined
  rememberChoices({ teamId: fields.teamId, inclinationDeg: angle })
}

/**
 * The team and angle last used on this device, as a change to an untouched draft (no patient code, no angle yet);
 * the team only while the user may still use it. Empty when nothing applies.
 */
export function rememberedPatch(fields: DraftFields | undefined, teams: readonly TeamRef[]): Partial<DraftFields> {
  if (!fields || fields.patientCode || fields.inclinationDeg != null) return {}
  const last = lastChoices()
  const team = teams.find((t) => t.id === last.teamId)
  const patch: Partial<DraftFields> = {}
  if (team && !fields.teamId) patch.teamId = team.id
  if (last.inclinationDeg !== undefined) Object.assign(patch, { inclinationDeg: last.inclinationDeg, inclinationSource: 'entered' })
  return patch
}
