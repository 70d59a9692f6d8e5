import { NO_NAMES, fieldLines, isFromTo, valueText, type ChangeLine } from './audit-lines'
import type { AuditWords } from './audit-fields'
import { capitalise } from './exam-words'

export type { AuditWords } from './audit-fields'
export { valueText, type ChangeLine } from './audit-lines'

const ACTION_LABEL: Record<string, string> = {
  login: 'Signed in',
  'login-failed': 'Sign-in failed',
  logout: 'Signed out',
  'exam-create': 'Exam created',
  'exam-update': 'Exam changed',
  'exam-submit': 'Sent for countersignature',
  'exam-countersign': 'Countersigned',
  'exam-countersign-failed': 'Countersigning refused',
  'exam-return': 'Returned with a comment',
  'exam-amend': 'Reopened as a draft (amended)',
  'exam-export': 'Exported (FHIR)',
  'exams-export': 'Exams exported (CSV)',
  'agreement-pairs-export': 'Agreement pairs exported (CSV)',
  'attachment-add': 'Photo attached',
  'attachment-delete': 'Photo removed',
  'account-invited': 'Account created by invitation',
  'invitation-sent': 'Invitation e-mailed',
  'invitation-accepted': 'Invitation accepted',
  'account-renamed': 'Display name changed',
  'account-roles-changed': 'Roles changed',
  'account-teams-changed': 'Teams changed',
  'account-deactivated': 'Account deactivated',
  'account-reactivated': 'Account reactivated',
  'password-reset-requested': 'Password reset asked for',
  'password-reset-used': 'Password set by reset link',
  'roster-import': 'Roster imported',
  'round-create': 'Calibration round opened',
  'round-close': 'Calibration round closed',
  'settings-update': 'Settings changed',
}

/** The actions the trail is known to hold, for the filter's suggestions. */
export const KNOWN_ACTIONS = Object.keys(ACTION_LABEL)

/** An audit action in words; an action this client does not know yet shows as stored. */
export function actionLabel(action: string): string {
  return ACTION_LABEL[action] ?? action
}

/** An event's `changes` as stored: "field: before → after" for changed fields, "field: value" for other details. */
export function rawChangeLines(changes: Record<string, unknown> | null): ChangeLine[] {
  return Object.entries(changes ?? {}).map(([field, value]) =>
    isFromTo(value) ? { field, from: valueText(value.from), to: valueText(value.to) } : { field, to: valueText(value) },
  )
}

/**
 * An event's `changes` in the words of the form: its labels, its values (team names, units, venous signs as
 * present/absent/not tested, one time format); ids and hashes are marked `detail`. A new record (`created`) lists
 * what it was made with, leaving out empty fields and the "before" that it never had.
 */
export function changeLines(changes: Record<string, unknown> | null, names: AuditWords = NO_NAMES, created = false): ChangeLine[] {
  const lines = Object.entries(changes ?? {}).flatMap(([field, value]) => fieldLines(field, value, names))
  return created ? lines.filter((line) => line.to !== '—').map(({ from: _from, ...line }) => line) : lines
}

/** Whether an action makes a new record, whose changes are its first values. */
export const isCreation = (action: string) => action.endsWith('-create')

/** The words an event needs from the teams the reader can see. */
export function wordsFromTeams(teams: readonly { id: string; name: string }[]): AuditWords {
  const names = new Map(teams.map((team) => [team.id, team.name]))
  return { teamName: (id) => names.get(id) }
}

const ENTITY_LABEL: Record<string, string> = {
  exam: 'Exam',
  user: 'Account',
  round: 'Calibration round',
  settings: 'Settings',
  export: 'Export',
}

/** The kind of record an event is about, in words. */
export function entityLabel(entityType: string | null): string {
  return entityType ? (ENTITY_LABEL[entityType] ?? capitalise(entityType)) : ''
}
