import type { ExamInput, ExamStatus } from '#shared/schemas/exam'
import type { User } from '#shared/schemas/user'
import { belongsTo } from '../users/team-members.ts'

const EDITABLE: ReadonlySet<ExamStatus> = new Set(['draft', 'returned'])

/** Drafts and returned exams can change (findings and photos); submitted and countersigned ones are locked. */
export const isEditable = (status: string): boolean => EDITABLE.has(status as ExamStatus)

/** Whether the user recorded the exam: only its author changes it, and nobody countersigns their own. */
export const isAuthor = (row: { examinerId: string }, user: Pick<User, 'id'>): boolean => row.examinerId === user.id

/** How far ahead of the server's clock an exam time may lie, for device clocks that run fast (product default, no published source). */
export const FUTURE_TOLERANCE_MS = 5 * 60 * 1000

/** What the rules below compare a change with: the stored exam, or nothing for a new one. */
export interface StoredAuthorFields {
  teamId: string
  examinedAt: Date
}

/**
 * Rules the schema cannot know, for a new exam or a changed value: the author files it to one of their own teams, and
 * its time is not in the future by the server's clock. Field messages keyed as the schema's are; null when it passes.
 */
export function authorFieldErrors(author: User, input: ExamInput, before: StoredAuthorFields | null): Record<string, string> | null {
  const fields: Record<string, string> = {}
  if (input.teamId !== before?.teamId && !belongsTo(author, input.teamId)) fields.teamId = 'Choose one of your own teams'
  const examinedAt = new Date(input.examinedAt).getTime()
  if (examinedAt !== before?.examinedAt.getTime() && examinedAt > Date.now() + FUTURE_TOLERANCE_MS)
    fields.examinedAt = 'The time of the exam cannot be in the future'
  return Object.keys(fields).length ? fields : null
}
