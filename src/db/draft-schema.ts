import { z } from 'zod'
import type { TeamRef } from '#shared/schemas/user'
import { defaultOffsetModelInUse } from '@/stores/settings'
import {
  AWaveSchema,
  ColumnTopSchema,
  HeightMethodSchema,
  InclinationSourceSchema,
  OffsetModelSchema,
  ReadingPrecisionSchema,
  RespiratorySchema,
  RhythmSchema,
  VeinSchema,
  VenousSignSchema,
  VWaveSchema,
  YDescentSchema,
} from '#shared/schemas/exam'

// Rows written by older app versions may hold values this version no longer accepts: drop that one field, keep the rest.
function maybe<T extends z.ZodType>(schema: T) {
  return schema.optional().catch(undefined)
}

const venousSigns = z
  .array(z.unknown())
  .transform((signs) => signs.filter((sign) => VenousSignSchema.safeParse(sign).success) as z.infer<typeof VenousSignSchema>[])

/** Every exam field as typed so far: all optional, numbers may be cleared to null. */
export const DraftFieldsSchema = z.object({
  patientCode: maybe(z.string()),
  /** The calibration round the exam is an entry of; null or absent for an ordinary exam. */
  roundId: maybe(z.string().nullable()),
  teamId: maybe(z.string()),
  examinedAt: maybe(z.string()),
  inclinationDeg: maybe(z.number().nullable()),
  inclinationSource: maybe(InclinationSourceSchema),
  vein: maybe(VeinSchema),
  venousSigns: maybe(venousSigns),
  rhythm: maybe(RhythmSchema),
  columnTop: maybe(ColumnTopSchema),
  heightMethod: maybe(HeightMethodSchema),
  heightCm: maybe(z.number().nullable()),
  alongNeckCm: maybe(z.number().nullable()),
  readingPrecision: maybe(ReadingPrecisionSchema),
  offsetModel: maybe(OffsetModelSchema),
  waveform: maybe(z.object({ aWave: maybe(AWaveSchema), vWave: maybe(VWaveSchema), yDescent: maybe(YDescentSchema) })),
  respiratory: maybe(RespiratorySchema),
  abdominojugular: maybe(z.object({ done: maybe(z.boolean()), riseCm: maybe(z.number().nullable()), sustained: maybe(z.boolean()) })),
  notes: maybe(z.string()),
})
export type DraftFields = z.infer<typeof DraftFieldsSchema>

export const DraftStateSchema = z.enum(['editing', 'saved'])
export type DraftState = z.infer<typeof DraftStateSchema>

/** A bedside exam kept on this device; its id becomes the exam's id on the server. */
export const DraftRowSchema = z.object({
  id: z.string().min(1),
  fields: DraftFieldsSchema.catch({}),
  step: z.number().int().min(0).max(4).catch(0),
  state: DraftStateSchema.catch('editing'),
  createdAt: z.string(),
  updatedAt: z.string(),
})
export type DraftRow = z.infer<typeof DraftRowSchema>

/** A new draft with the exam's defaults; the team is preselected when the user has only one. */
export function newDraft(teams: readonly TeamRef[], now = new Date()): DraftRow {
  const stamp = now.toISOString()
  return {
    id: crypto.randomUUID(),
    fields: {
      patientCode: '',
      teamId: teams.length === 1 ? teams[0]!.id : undefined,
      examinedAt: stamp,
      inclinationDeg: null,
      inclinationSource: 'entered',
      vein: 'right-internal',
      venousSigns: [],
      rhythm: 'unknown',
      heightMethod: 'vertical',
      readingPrecision: 'ruler',
      offsetModel: defaultOffsetModelInUse(),
      waveform: { aWave: 'unclear', vWave: 'unclear', yDescent: 'unclear' },
      respiratory: 'not-assessed',
      abdominojugular: { done: false },
      notes: '',
    },
    step: 0,
    state: 'editing',
    createdAt: stamp,
    updatedAt: stamp,
  }
}
