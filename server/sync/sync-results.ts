import { ZodError } from 'zod'
import type { Exam } from '#shared/schemas/exam'
import type { SyncItemError, SyncResult } from '#shared/schemas/sync'
import { AppError, fieldsOf, invalidInput } from '../errors.ts'

export const applied = (id: string, version: number): SyncResult => ({ id, result: 'applied', version })
export const duplicate = (id: string, version: number): SyncResult => ({ id, result: 'duplicate', version })
export const conflictWith = (exam: Exam): SyncResult => ({ id: exam.id, result: 'conflict', exam })
export const rejected = (id: string, error: SyncItemError): SyncResult => ({ id, result: 'rejected', error })

const itemError = (e: AppError): SyncItemError => ({ code: e.code, message: e.message, fields: e.fields })

/** One change's field errors, as the error handler answers them for a whole request. */
export const invalid = (fields: Record<string, string>): SyncItemError => itemError(invalidInput(fields))

/** The server copy a 409 of the exams service carries, if any. */
export function serverCopyOf(e: unknown): Exam | undefined {
  return e instanceof AppError && e.status === 409 ? (e.extra?.exam as Exam | undefined) : undefined
}

/**
 * One change's 4xx as its answer: a 409 whose server copy moved past the change's base is a conflict; any other 4xx
 * (invalid, forbidden, locked) rejects this change only. Anything else fails the whole push, which the client retries.
 */
export function resultOfError(id: string, baseVersion: number, thrown: unknown): SyncResult {
  const e = thrown instanceof ZodError ? invalidInput(fieldsOf(thrown)) : thrown
  if (!(e instanceof AppError) || e.status >= 500) throw e
  const server = serverCopyOf(e)
  if (server && server.version !== baseVersion) return conflictWith(server)
  return rejected(id, itemError(e))
}
