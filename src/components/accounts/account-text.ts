import type { AccountStatus } from '#shared/schemas/account'
import type { Role } from '#shared/schemas/user'

export const ROLE_LABEL: Record<Role, string> = {
  resident: 'Resident',
  attending: 'Attending',
  educator: 'Educator',
  admin: 'Admin',
}

export const ROLE_ITEMS = (Object.keys(ROLE_LABEL) as Role[]).map((value) => ({ value, title: ROLE_LABEL[value] }))

export const STATUS_TEXT: Record<AccountStatus, { label: string; color: string; icon: string }> = {
  active: { label: 'Active', color: 'success', icon: 'mdi-check-circle-outline' },
  invited: { label: 'Invited', color: 'info', icon: 'mdi-email-fast-outline' },
  deactivated: { label: 'Deactivated', color: 'error', icon: 'mdi-account-cancel-outline' },
}

/** zod issues → `{ field: message }`, first message per top-level field, as the API's `fields`. */
export function fieldErrorsOf(issues: { path: PropertyKey[]; message: string }[]): Record<string, string> {
  const fields: Record<string, string> = {}
  for (const issue of issues) fields[String(issue.path[0] ?? '_')] ??= issue.message
  return fields
}
