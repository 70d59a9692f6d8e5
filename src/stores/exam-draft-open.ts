import type { DraftRow } from '@/db/draft-schema'
import { saveDraft } from '@/db/drafts'
import { draftFromExam } from '@/db/exam-drafts'
import { loadLocalExam } from '@/db/local-exams'

const EDITABLE = new Set(['draft', 'returned'])

/** The user's own exam kept on this device, stored as a draft to change, while it can still change. */
export async function draftOfLocalExam(id: string, userId: string | undefined): Promise<DraftRow | undefined> {
  const exam = userId ? await loadLocalExam(id, userId) : undefined
  if (!exam || exam.examinerId !== exam.ownerId || !EDITABLE.has(exam.status)) return undefined
  const row = draftFromExam(exam)
  await saveDraft(row)
  return row
}
