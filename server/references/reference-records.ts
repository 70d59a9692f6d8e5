import { Op } from 'sequelize'
import { ReferenceSchema, type Reference } from '#shared/schemas/reference'
import { ReferenceModel, UserModel, type ExamModel } from '../models/index.ts'
import { currentSettings } from '../settings/settings.service.ts'

/** Whether a measured pressure is close enough in time to its exam to form an accuracy pair. */
export const withinWindow = (measuredAt: Date, examinedAt: Date, windowMinutes: number): boolean =>
  Math.abs(measuredAt.getTime() - examinedAt.getTime()) <= windowMinutes * 60_000

/** The reference window of the settings in force, in minutes. */
export async function referenceWindow(): Promise<number> {
  return (await currentSettings()).values.referenceWindowMinutes
}

/** Stored references in the API's shape, `paired` against their exam's time under the window in force. */
export async function presentReferences(rows: ReferenceModel[], exams: ExamModel[]): Promise<Reference[]> {
  if (!rows.length) return []
  const [users, windowMinutes] = await Promise.all([
    UserModel.findAll({ where: { id: { [Op.in]: [...new Set(rows.map((r) => r.addedById))] } } }),
    referenceWindow(),
  ])
  const names = new Map(users.map((u) => [u.id, u.displayName]))
  const examTimes = new Map(exams.map((e) => [e.id, e.examinedAt]))
  return rows.map((r) =>
    ReferenceSchema.parse({
      id: r.id,
      examId: r.examId,
      kind: r.kind,
      value: r.value,
      unit: r.unit,
      valueCmH2O: r.valueCmH2O,
      measuredAt: r.measuredAt.toISOString(),
      addedById: r.addedById,
      addedByName: names.get(r.addedById) ?? '',
      addedAt: r.addedAt.toISOString(),
      paired: withinWindow(r.measuredAt, examTimes.get(r.examId)!, windowMinutes),
    }),
  )
}

/** The references of these exams, oldest measurement first. */
export async function referencesOf(exams: ExamModel[]): Promise<Reference[]> {
  if (!exams.length) return []
  const rows = await ReferenceModel.findAll({
    where: { examId: { [Op.in]: exams.map((e) => e.id) } },
    order: [
      ['measuredAt', 'ASC'],
      ['addedAt', 'ASC'],
      ['id', 'ASC'],
    ],
  })
  return presentReferences(rows, exams)
}
