import type { Account } from '#shared/schemas/account'

export function makeAccount(overrides: Partial<Account> = {}): Account {
  return {
    id: 'acc-1',
    email: 'mei.tanaka@saltmarsh.test',
    displayName: 'Dr Mei Tanaka',
    roles: ['resident'],
    teams: [{ id: 'icu', name: 'Medical ICU' }],
    active: true,
    status: 'active',
    invitedAt: null,
    deactivatedAt: null,
    createdAt: '2026-12-01T09:00:00.000Z',
    ...overrides,
  }
}
