import type { ExamHistory } from '#shared/schemas/audit'
import type { SignatureList } from '#shared/schemas/signature'
import type { User } from '#shared/schemas/user'
import { maskEvents, presentEvents } from '../audit-trail/audit-events.ts'
import { readableRow, type Viewer } from '../exams/exam-queries.ts'
import { AuditEventModel } from '../models/index.ts'
import { signaturesOf } from './signatures.ts'

/** The exam's signatures, each verified against what it signed; for anyone who may read the exam. */
export async function examSignatures(user: User, id: string): Promise<SignatureList> {
  const { row } = await readableRow(user, id)
  return { signatures: (await signaturesOf([row])).get(row.id) ?? [] }
}

/** The exam's audit events, oldest first; a reader who sees the code masked sees it masked in every before/after too. */
export async function examHistory(viewer: Viewer, id: string): Promise<ExamHistory> {
  const { row, scope } = await readableRow(viewer.user, id)
  const rows = await AuditEventModel.findAll({ where: { entityType: 'exam', entityId: id }, order: [['at', 'ASC'], ['id', 'ASC']] })
  const events = await presentEvents(rows)
  return { events: scope.showsCode(row) ? events : maskEvents(events, [row.patientCode], viewer.mask) }
}
