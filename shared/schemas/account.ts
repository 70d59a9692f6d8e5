import { z } from 'zod'
import { idField, lineField, lowerUuid } from './fields.ts'
import { RoleSchema, TeamRefSchema } from './user.ts'

/**
 * Password length rules, from OWASP ASVS 4.0.3 (level 2):
 * 2.1.1 "at least 12 characters", 2.1.2 "64 characters or more are permitted" and "more than 128 are denied";
 * 2.1.4 any printable Unicode character and spaces are allowed; 2.1.9 no composition rules (no "one digit, one capital").
 * NIST SP 800-63B, section 5.1.1.2, says the same in spirit: a minimum length, a maximum of at least 64, no composition rules,
 * and a check against values known to be commonly used or compromised (that list lives on the server).
 * Length counts Unicode code points, so an accented letter or an emoji counts as one character.
 */
export const PASSWORD_MIN = 12
export const PASSWORD_MAX = 128

export const PASSWORD_RULES_TEXT = [
  `At least ${PASSWORD_MIN} characters (at most ${PASSWORD_MAX}); spaces and any letters or symbols are fine.`,
  'Not your e-mail address or the part of it before the @.',
  'Not a password found on lists of the most common ones.',
  'A short sentence of unrelated words is easy to remember and hard to guess.',
]

/** Characters as a reader counts them (code points), not UTF-16 units. */
export function passwordLength(password: string): number {
  return [...password].length
}

/**
 * The rules that need no list: length, and not containing the e-mail address's local part (if it is at least
 * 3 characters long, compared without case). Returns the message for `fields.password`, or null when they pass.
 */
export function passwordRuleProblem(password: string, email?: string | null): string | null {
  const length = passwordLength(password)
  if (length < PASSWORD_MIN) return `Use at least ${PASSWORD_MIN} characters (this has ${length})`
  if (length > PASSWORD_MAX) return `Use at most ${PASSWORD_MAX} characters`
  const local = email?.split('@')[0]?.trim().toLowerCase() ?? ''
  if (local.length >= 3 && password.toLowerCase().includes(local)) return 'Do not use your e-mail address in the password'
  return null
}

const email = z
  .string()
  .trim()
  .toLowerCase()
  .pipe(z.email({ message: 'Enter a valid e-mail address' }))
  .pipe(z.string().max(254, 'Use at most 254 characters'))

const displayName = z.string().trim().min(1, 'Enter a name').max(120, 'Use at most 120 characters')
const roles = z.array(RoleSchema).min(1, 'Choose at least one role').max(4)
const teamIds = z.array(z.string().min(1).max(36).transform(lowerUuid)).max(50)

/** An account as the admin screen sees it. */
export const AccountStatusSchema = z.enum(['active', 'invited', 'deactivated'])
export type AccountStatus = z.infer<typeof AccountStatusSchema>

export const AccountSchema = z.object({
  id: z.string(),
  email: z.string(),
  displayName: z.string(),
  roles: z.array(RoleSchema),
  teams: z.array(TeamRefSchema),
  active: z.boolean(),
  /** `invited`: active but no password chosen yet. */
  status: AccountStatusSchema,
  invitedAt: z.string().nullable(),
  deactivatedAt: z.string().nullable(),
  createdAt: z.string(),
})
export type Account = z.infer<typeof AccountSchema>

export const AccountQuerySchema = z.object({
  search: lineField(120).optional(),
  role: RoleSchema.optional(),
  teamId: idField('Choose a team').optional(),
  active: z.enum(['true', 'false']).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
})
export type AccountQuery = z.infer<typeof AccountQuerySchema>

export const AccountPageSchema = z.object({
  accounts: z.array(AccountSchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
})
export type AccountPage = z.infer<typeof AccountPageSchema>

/** `POST /api/admin/accounts`: the account is created without a password and an invitation is e-mailed. */
export const InviteInputSchema = z.strictObject({ email, displayName, roles, teamIds: teamIds.default([]) })
export type InviteInput = z.infer<typeof InviteInputSchema>

/** `PATCH /api/admin/accounts/:id`: only these fields (ASVS 5.1.2 mass-assignment allowlist). */
export const AccountPatchSchema = z
  .strictObject({ displayName: displayName.optional(), roles: roles.optional(), teamIds: teamIds.optional() })
  .refine((p) => p.displayName !== undefined || p.roles !== undefined || p.teamIds !== undefined, {
    message: 'Change at least one field',
  })
export type AccountPatch = z.infer<typeof AccountPatchSchema>

/** `POST /api/auth/password-reset`. */
export const PasswordResetRequestSchema = z.strictObject({ email })
export type PasswordResetRequest = z.infer<typeof PasswordResetRequestSchema>

/** The one answer to a reset request, whether or not the address has an account. */
export const PASSWORD_RESET_ACCEPTED = {
  status: 'accepted',
  message: 'If an active account uses this address, a link to choose a new password is on its way. It works once, for 1 hour.',
} as const
export const PasswordResetAcceptedSchema = z.object({ status: z.literal('accepted'), message: z.string() })

/** `POST /api/auth/set-password`: the token from an invitation or reset link, and the new password. */
export const SetPasswordInputSchema = z.strictObject({
  token: z.string().min(1, 'The link is incomplete').max(200),
  // The length rules are checked with the account's e-mail on the server, so the message can name them.
  password: z.string().min(1, 'Enter a password').max(1000, `Use at most ${PASSWORD_MAX} characters`),
})
export type SetPasswordInput = z.infer<typeof SetPasswordInputSchema>

export const SetPasswordResultSchema = z.object({ email: z.string(), purpose: z.enum(['invitation', 'reset']) })
export type SetPasswordResult = z.infer<typeof SetPasswordResultSchema>
