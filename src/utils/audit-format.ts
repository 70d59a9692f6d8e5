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

export interface ChangeLine {
  field: string
  /** Set for a changed field; absent for other details such as a failure's reason. */
  from?: string
  to: string
}

const MAX_TEXT = 80

function shorten(text: string): string {
  return text.length > MAX_TEXT ? `${text.slice(0, MAX_TEXT - 1)}…` : text
}

/** A stored before/after value as short readable text. */
export function valueText(value: unknown): string {
  if (value === null || value === undefined || value === '') return '—'
  if (Array.isArray(value)) return value.length ? shorten(value.map(valueText).join(', ')) : 'none'
  if (typeof value === 'object')
    return shorten(Object.entries(value).map(([key, inner]) => `${key} ${valueText(inner)}`).join('; '))
  return shorten(String(value))
}

function isFromTo(value: unknown): value is { from: unknown; to: unknown } {
  return typeof value === 'object' && value !== null && 'from' in value && 'to' in value
}

/** An event's `changes` as lines: "field: before → after" for changed fields, "field: value" for other details. */
export function changeLines(changes: Record<string, unknown> | null): ChangeLine[] {
  return Object.entries(changes ?? {}).map(([field, value]) =>
    isFromTo(value) ? { field, from: valueText(value.from), to: valueText(value.to) } : { field, to: valueText(value) },
  )
}
