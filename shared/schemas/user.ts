import { z } from 'zod'

export const RoleSchema = z.enum(['resident', 'attending', 'educator', 'admin'])
export type Role = z.infer<typeof RoleSchema>

export const TeamRefSchema = z.object({ id: z.string(), name: z.string() })
export type TeamRef = z.infer<typeof TeamRefSchema>

export const UserSchema = z.object({
  id: z.string(),
  email: z.string(),
  displayName: z.string(),
  roles: z.array(RoleSchema),
  active: z.boolean(),
  teams: z.array(TeamRefSchema),
})
export type User = z.infer<typeof UserSchema>

export const LoginInputSchema = z.object({
  email: z.string().trim().toLowerCase().pipe(z.email({ message: 'Enter a valid e-mail address' })).pipe(z.string().max(254)),
  password: z.string().min(1, 'Enter your password').max(200),
})
export type LoginInput = z.infer<typeof LoginInputSchema>

export const SessionSchema = z.object({ token: z.string(), user: UserSchema })
export type Session = z.infer<typeof SessionSchema>

export const HealthSchema = z.object({ status: z.literal('ok'), demo: z.boolean() })

export const UserListSchema = z.object({ users: z.array(UserSchema) })

export const TeamMemberSchema = z.object({ id: z.string(), displayName: z.string(), roles: z.array(RoleSchema) })
export const TeamSchema = z.object({ id: z.string(), name: z.string(), members: z.array(TeamMemberSchema) })
export type Team = z.infer<typeof TeamSchema>
export const TeamListSchema = z.object({ teams: z.array(TeamSchema) })

export const ApiErrorSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.record(z.string(), z.string()).optional(),
  }),
})
export type ApiError = z.infer<typeof ApiErrorSchema>
