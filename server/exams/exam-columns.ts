import type { Estimate, ExamInput } from '#shared/schemas/exam'
import type { ExamModel } from '../models/index.ts'

/** Column values for a validated record and the estimate the server computed from it. */
export function columnsOf(input: ExamInput, estimate: Estimate) {
  return {
    patientCode: input.patientCode,
    teamId: input.teamId,
    examinedAt: new Date(input.examinedAt),
    inclinationDeg: input.inclinationDeg,
    inclinationSource: input.inclinationSource,
    vein: input.vein,
    columnTop: input.columnTop,
    heightMethod: input.heightMethod,
    heightCm: input.heightCm ?? null,
    alongNeckCm: input.alongNeckCm ?? null,
    readingPrecision: input.readingPrecision,
    offsetModel: input.offsetModel,
    venousSigns: JSON.stringify(input.venousSigns),
    venousConfirmed: input.venousConfirmed,
    notAssessableReason: input.notAssessableReason ?? null,
    notAssessableText: input.notAssessableText ?? null,
    context: JSON.stringify(input.context),
    rhythm: input.rhythm,
    waveform: JSON.stringify(input.waveform),
    respiratory: input.respiratory,
    abdominojugular: JSON.stringify(input.abdominojugular),
    notes: input.notes,
    roundId: input.roundId ?? null,
    estimate: JSON.stringify(estimate),
    verticalHeightCm: estimate.heightCm,
    cvpCmH2O: estimate.cvpCmH2O,
    bandLowCmH2O: estimate.bandCmH2O?.[0] ?? null,
    bandHighCmH2O: estimate.bandCmH2O?.[1] ?? null,
  }
}

/**
 * Fields added after exams were first stored, only where they hold something: a record saved before them keeps the
 * signed content (and so the hash) it was countersigned with.
 */
function laterFields(row: ExamModel): Record<string, unknown> {
  const context = JSON.parse(row.context ?? '[]') as unknown[]
  return {
    ...(row.venousConfirmed ? { venousConfirmed: true } : {}),
    ...(row.notAssessableReason ? { notAssessableReason: row.notAssessableReason } : {}),
    ...(row.notAssessableText ? { notAssessableText: row.notAssessableText } : {}),
    ...(context.length ? { context } : {}),
  }
}

/** The stored record in the shape a client sends, unvalidated: the base a PATCH merges into. */
export function storedInput(row: ExamModel): Record<string, unknown> {
  return {
    id: row.id,
    patientCode: row.patientCode,
    teamId: row.teamId,
    examinedAt: row.examinedAt.toISOString(),
    notes: row.notes,
    // Only on round entries: the signed content (and so the hash) of every other exam stays as it was.
    ...(row.roundId ? { roundId: row.roundId } : {}),
    inclinationDeg: row.inclinationDeg,
    inclinationSource: row.inclinationSource,
    vein: row.vein,
    columnTop: row.columnTop,
    heightMethod: row.heightMethod,
    heightCm: row.heightCm,
    alongNeckCm: row.alongNeckCm,
    readingPrecision: row.readingPrecision,
    offsetModel: row.offsetModel,
    venousSigns: JSON.parse(row.venousSigns),
    rhythm: row.rhythm,
    waveform: JSON.parse(row.waveform),
    respiratory: row.respiratory,
    abdominojugular: JSON.parse(row.abdominojugular),
    ...laterFields(row),
  }
}

function withSortedKeys(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(withSortedKeys)
  // A value JSON writes through toJSON (a Date) is left to it, as the replacer this replaces did.
  if (!value || typeof value !== 'object' || typeof (value as { toJSON?: unknown }).toJSON === 'function') return value
  const sorted: Record<string, unknown> = {}
  for (const key of Object.keys(value).sort()) sorted[key] = withSortedKeys((value as Record<string, unknown>)[key])
  return sorted
}

/** JSON with every object's keys sorted, so equal content always serialises to equal text (signature hashes rest on it). */
export function sortedJson(value: unknown): string {
  return JSON.stringify(withSortedKeys(value))
}
