import type { AgreementRoleSchema } from '#shared/schemas/agreement'
import type { z } from 'zod'
import { UserModel } from '../models/index.ts'
import { rolesOf } from '../users/users.service.ts'

export interface Examiner {
  name: string
  /** An account holding the attending role counts as the attending of a pair, whatever else it holds. */
  role: z.infer<typeof AgreementRoleSchema>
}

/** Every account by id with its printed name and pairing role; accounts are few, so one small query. */
export async function loadExaminers(): Promise<Map<string, Examiner>> {
  const users = await UserModel.findAll({ attributes: ['id', 'displayName', 'roles'] })
  return new Map(users.map((u) => [u.id, { name: u.displayName, role: rolesOf(u).includes('attending') ? 'attending' : 'resident' }]))
}

/** The accounts that count as the attending of a pair. */
export const attendingIdsOf = (examiners: Map<string, Examiner>): string[] =>
  [...examiners].filter(([, e]) => e.role === 'attending').map(([id]) => id)
