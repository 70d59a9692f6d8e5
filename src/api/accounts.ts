import {
  AccountPageSchema,
  AccountSchema,
  PasswordResetAcceptedSchema,
  SetPasswordResultSchema,
  type AccountPatch,
  type AccountQuery,
  type InviteInput,
  type SetPasswordInput,
} from '#shared/schemas/account'
import { api } from './client'

export type AccountFilters = Partial<Omit<AccountQuery, 'page' | 'pageSize'>> & { page?: number; pageSize?: number }

export function fetchAccounts(filters: AccountFilters) {
  const searchParams = Object.fromEntries(
    Object.entries(filters).filter(([, v]) => v !== undefined && v !== null && v !== '').map(([k, v]) => [k, String(v)]),
  )
  return api.get('admin/accounts', { searchParams }).json().then((body) => AccountPageSchema.parse(body))
}

export function inviteAccount(input: InviteInput) {
  return api.post('admin/accounts', { json: input }).json().then((body) => AccountSchema.parse(body))
}

export function updateAccount(id: string, patch: AccountPatch) {
  return api.patch(`admin/accounts/${encodeURIComponent(id)}`, { json: patch }).json().then((body) => AccountSchema.parse(body))
}

export function deactivateAccount(id: string) {
  return api.post(`admin/accounts/${encodeURIComponent(id)}/deactivate`).json().then((body) => AccountSchema.parse(body))
}

export function reactivateAccount(id: string) {
  return api.post(`admin/accounts/${encodeURIComponent(id)}/reactivate`).json().then((body) => AccountSchema.parse(body))
}

export function resendInvitation(id: string) {
  return api.post(`admin/accounts/${encodeURIComponent(id)}/invitation`).json().then((body) => AccountSchema.parse(body))
}

/** Public: always answers the same neutral confirmation. */
export function requestPasswordReset(email: string) {
  return api.post('auth/password-reset', { json: { email } }).json().then((body) => PasswordResetAcceptedSchema.parse(body))
}

/** Public: sets the password through an invitation or reset link's token. */
export function setPasswordWithLink(input: SetPasswordInput) {
  return api.post('auth/set-password', { json: input }).json().then((body) => SetPasswordResultSchema.parse(body))
}
