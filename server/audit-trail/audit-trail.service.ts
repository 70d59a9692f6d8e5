import { Op, type WhereOptions } from 'sequelize'
import type { AuditPage, AuditQuery } from '#shared/schemas/audit'
import { invalidInput } from '../errors.ts'
import { AuditEventModel, ExamModel } from '../models/index.ts'
import { maskEvents, presentEvents } from './audit-events.ts'

function whereOf(query: AuditQuery): WhereOptions<AuditEventModel> {
  if (query.from && query.to && new Date(query.from) > new Date(query.to))
    throw invalidInput({ to: 'The end of the range is before its start' })
  const at = {
    ...(query.from && { [Op.gte]: new Date(query.from) }),
    ...(query.to && { [Op.lte]: new Date(query.to) }),
  }
  return {
    ...(query.actorId && { actorId: query.actorId }),
    ...(query.action && { action: query.action }),
    ...(query.entityType && { entityType: query.entityType }),
    ...(query.entityId && { entityId: query.entityId }),
    ...((query.from || query.to) && { at }),
  }
}

async function currentCodes(examIds: string[]): Promise<string[]> {
  const rows = await ExamModel.findAll({ where: { id: { [Op.in]: examIds } }, attributes: ['patientCode'] })
  return rows.map((r) => r.patientCode)
}

/**
 * The trail for an administrator, newest first. Admins do no clinical work (README, Roles), so patient codes are
 * shown as the same pseudonyms educators see: events about one patient still line up.
 */
export async function browseAudit(query: AuditQuery, mask: (code: string) => string): Promise<AuditPage> {
  const { rows, count } = await AuditEventModel.findAndCountAll({
    where: whereOf(query),
    order: [['at', 'DESC'], ['id', 'DESC']],
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize,
  })
  const examIds = rows.flatMap((r) => (r.entityType === 'exam' && r.entityId ? [r.entityId] : []))
  const events = maskEvents(await presentEvents(rows), await currentCodes(examIds), mask)
  return { events, total: count, page: query.page, pageSize: query.pageSize }
}
