import { z } from 'zod'
import type { TeamRef } from '#shared/schemas/user'
import {
  AWaveSchema,
  ContextFlagSchema,
  ExamInputSchema,
  NO_VENOUS_SIGNS,
  VenousSignSchema,
  VenousSignStateSchema,
  VWaveSchema,
  YDescentSchema,
  type OffsetModel,
} from '#shared/schemas/exam'

// Rows written by older app versions may hold values this version no longer accepts: drop that one field, keep the rest.
function maybe<T extends z.ZodType>(schema: T) {
  return schema.optional().catch(undefined)
}

type Bare<T> = T extends z.ZodDefault<infer Inner> ? Inner : T

/** Each field optional and dropped when unreadable; a draft holds only what was chosen, so no exam defaults. */
function lenient<S extends Record<string, z.ZodType>>(shape: S) {
  const bare = (schema: z.ZodType) => (schema instanceof z.ZodDefault ? schema.removeDefault() : schema) as z.ZodType
  const fields = Object.entries<z.ZodType>(shape).map(([key, schema]) => [key, maybe(bare(schema))])
  return Object.fromEntries(fields) as { [K in keyof S]: z.ZodCatch<z.ZodOptional<Bare<S[K]>>> }
}

type SignStates = Partial<Record<z.infer<typeof VenousSignSchema>, z.infer<typeof VenousSignStateSchema>>>

/** Each sign with its state; drafts of the previous app version hold the list of signs found present. */
function readSigns(value: unknown): SignStates {
  const entries = Array.isArray(value) ? value.map((sign) => [sign, 'present']) : Object.entries(value as object)
  const known = entries.filter(([sign, state]) => VenousSignSchema.safeParse(sign).success && VenousSignStateSchema.safeParse(state).success)
  return Object.fromEntries(known) as SignStates
}

const venousSigns = z.union([z.array(z.unknown()), z.record(z.string(), z.unknown())]).transform(readSigns)
const contextFlags = z.array(z.unknown()).transform((flags) => flags.filter((flag) => ContextFlagSchema.safeParse(flag).success) as z.infer<typeof ContextFlagSchema>[])

// The exam's own fields, without the cross-field checks a half-typed exam cannot pass yet (and zod cannot pick from).
const ExamFieldsSchema = z.object(ExamInputSchema.shape).omit({ id: true, reviewed: true })

/**
 * Every exam field as typed so far, all optional: the choices as the exam schema has them; text kept as typed and
 * numbers (clearable to null) kept even out of range, so the step can show the error; the groups field by field.
 */
export const DraftFieldsSchema = z.object(lenient(ExamFieldsSchema.shape)).extend({
  patientCode: maybe(z.string()),
  roundId: maybe(z.string().nullable()),
  teamId: maybe(z.string()),
  examinedAt: maybe(z.string()),
  notes: maybe(z.string()),
  notAssessableText: maybe(z.string().nullable()),
  inclinationDeg: maybe(z.number().nullable()),
  heightCm: maybe(z.number().nullable()),
  alongNeckCm: maybe(z.number().nullable()),
  venousSigns: maybe(venousSigns),
  context: maybe(contextFlags),
  waveform: maybe(z.object({ aWave: maybe(AWaveSchema), vWave: maybe(VWaveSchema), yDescent: maybe(YDescentSchema) })),
  abdominojugular: maybe(
    z.object({ done: maybe(z.boolean()), riseCm: maybe(z.number().nullable()), sustained: maybe(z.boolean()), fallOnReleaseCm: maybe(z.number().nullable()) }),
  ),
  // The flow's own answers, never sent: the trunk angle checked after a phone reading, and the inclination at which
  // the examiner, asked to sit the patient up, confirmed the top still above the visible neck.
  inclinationConfirmed: maybe(z.boolean()),
  aboveNeckConfirmedDeg: maybe(z.number().nullable()),
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

/** A new draft with the exam's defaults and the settings' offset model; the team is preselected when the user has only one. */
export function newDraft(teams: readonly TeamRef[], offsetModel: OffsetModel, now = new Date()): DraftRow {
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
      venousSigns: { ...NO_VENOUS_SIGNS },
      venousConfirmed: false,
      rhythm: 'unknown',
      heightMethod: 'vertical',
      readingPrecision: 'ruler',
      offsetModel,
      waveform: { aWave: 'unclear', vWave: 'unclear', yDescent: 'unclear' },
      respiratory: 'not-assessed',
      abdominojugular: { done: false },
      context: [],
      notes: '',
    },
    step: 0,
    state: 'editing',
    createdAt: stamp,
    updatedAt: stamp,
  }
}
