import type { User } from '#shared/schemas/user'

export function makeUser(overrides: Partial<User> = {}): User {
  return {
    id: 'u-1',
    email: 'rowan.reed@saltmarsh.example',
    displayName: 'Rowan Reed',
    roles: ['resident'],
    active: true,
    teams: [{ id: 't-1', name: 'Cardiology A' }],
    ...overrides,
  }
}
