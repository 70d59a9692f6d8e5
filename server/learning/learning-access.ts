import type { User } from '#shared/schemas/user'
import { AppError, invalidInput } from '../errors.ts'
import { UserModel } from '../models/index.ts'
import { membersOf, teamIdsOf } from '../users/team-members.ts'
import { rolesOf } from '../users/users.service.ts'

export interface LearningViewer {
  user: User
  mask: (patientCode: string) => string
}

const notFound = () => new AppError('resident-not-found', 404, 'No such resident among those you supervise')

/**
 * Whose agreement the viewer may read, and how they see patient codes. A resident: their own (another's id is 404).
 * An attending: a resident of their teams, with real codes. An educator: any resident, codes as pseudonyms, as the
 * agreement dashboard shows the whole program to them.
 */
export async function residentFor(viewer: LearningViewer, residentId: string | undefined) {
  const { user, mask } = viewer
  const roles = new Set(user.roles)
  const id = residentId ?? user.id
  if (id === user.id) {
    if (!roles.has('resident')) throw invalidInput({ residentId: 'Choose a resident' })
    return { resident: user, codeOf: (code: string) => code }
  }
  if (!roles.has('attending') && !roles.has('educator')) throw notFound()
  const row = await UserModel.findByPk(id)
  if (!row || !rolesOf(row).includes('resident')) throw notFound()
  if (roles.has('attending') && (await membersOf(teamIdsOf(user))).has(id)) return { resident: row, codeOf: (code: string) => code }
  if (roles.has('educator')) return { resident: row, codeOf: mask }
  throw notFound()
}
