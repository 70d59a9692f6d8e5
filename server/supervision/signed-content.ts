import { createHash } from 'node:crypto'
import { sortedJson, storedInput } from '../exams/exam-columns.ts'
import type { ExamModel } from '../models/index.ts'

/**
 * The canonical serialisation a signature is bound to (21 CFR 11.70): every record field of the stored version,
 * its computed estimate, its version and its author, as JSON with sorted keys. Workflow state is left out.
 */
export function signedContent(row: ExamModel): string {
  return sortedJson({ ...storedInput(row), examinerId: row.examinerId, version: row.version, estimate: JSON.parse(row.estimate) })
}

export function sha256(text: string): string {
  return createHash('sha256').update(text, 'utf8').digest('hex')
}
