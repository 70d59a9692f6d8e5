import type { RosterChanges, RosterField, RosterRow, RosterRowStatus } from '#shared/schemas/roster'

export const STATUS_LOOK: Record<RosterRowStatus, { label: string; color: string; icon: string }> = {
  new: { label: 'New', color: 'success', icon: 'mdi-account-plus-outline' },
  changed: { label: 'Changed', color: 'info', icon: 'mdi-account-edit-outline' },
  unchanged: { label: 'Unchanged', color: 'default', icon: 'mdi-check' },
  invalid: { label: 'Invalid', color: 'error', icon: 'mdi-alert-circle-outline' },
}

export const FIELD_LABEL: Record<RosterField, string> = {
  email: 'E-mail',
  displayName: 'Display name',
  roles: 'Roles',
  team: 'Team',
  row: 'Line',
}

const CHANGE_LABEL: Record<keyof RosterChanges, string> = { displayName: 'Display name', roles: 'Roles', teams: 'Teams' }

const listText = (value: string | string[]) => (Array.isArray(value) ? (value.length ? value.join(', ') : 'none') : value)

export interface DetailLine {
  field: string
  text: string
}

/** What to say under a row: the reasons of an invalid row, the before → after of a changed one, and any notes. */
export function detailLines(row: RosterRow): DetailLine[] {
  const reasons = Object.entries(row.reasons ?? {}).map(([field, text]) => ({ field: FIELD_LABEL[field as RosterField] ?? field, text }))
  const changes = (Object.keys(CHANGE_LABEL) as (keyof RosterChanges)[]).flatMap((key) => {
    const change = row.changes?.[key]
    return change ? [{ field: CHANGE_LABEL[key], text: `${listText(change.from)} → ${listText(change.to)}` }] : []
  })
  const notes = (row.notes ?? []).map((text) => ({ field: 'Note', text }))
  return [...reasons, ...changes, ...notes]
}
