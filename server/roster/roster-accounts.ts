/**
 * How a new account starts, as the Accounts screen makes it (shared/schemas/account.ts, status `invited`):
 * active, but without a password until its holder follows the invitation link, so it cannot sign in before that.
 */
export function newAccountFields() {
  return { active: true, passwordHash: null } as const
}
