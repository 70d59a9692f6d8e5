import { ExamInputSchema, type ExamInput } from '#shared/schemas/exam'
import type { User } from '#shared/schemas/user'
import { db } from '@/db'
import { queueSave } from '@/db/outbox'
import { estimateBasisInUse } from '@/stores/settings'
import { makeDraft, WORKED_EXAMPLE } from '../factories/draft'
import { makeUser } from '../factories/user'

export const AUTHOR = makeUser({ id: 'u-1' })

/** The worked example (h = 4 cm at 45°) as a valid exam input. */
export function examInput(overrides: Partial<ExamInput> = {}): ExamInput {
  return ExamInputSchema.parse({ ...WORKED_EXAMPLE, id: crypto.randomUUID(), examinedAt: '2026-03-14T09:30:00.000Z', ...overrides })
}

/** Saves an exam as the bedside flow does, and answers its input. */
export async function save(input: ExamInput = examInput(), author: User = AUTHOR): Promise<ExamInput> {
  await queueSave(makeDraft({}, { id: input.id }), input, author, estimateBasisInUse())
  return input
}

export async function clearDevice() {
  await Promise.all([db.drafts.clear(), db.exams.clear(), db.outbox.clear(), db.meta.clear(), db.attachments.clear()])
}

export const queued = () => db.outbox.orderBy('seq').toArray()
