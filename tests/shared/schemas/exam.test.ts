import { describe, expect, it } from 'vitest'
import type { z } from 'zod'
import { ExamFindingsSchema, ExamInputSchema, ExamPatchSchema, NO_VENOUS_SIGNS, StoredEstimateSchema } from '#shared/schemas/exam'
import { makeExamBody } from '../factories.ts'

function messagesByField(result: z.ZodSafeParseResult<unknown>): Record<string, string[]> {
  const byField: Record<string, string[]> = {}
  for (const issue of result.error?.issues ?? []) (byField[issue.path.join('.')] ??= []).push(issue.message)
  return byField
}

describe('ExamInputSchema', () => {
  it('accepts a complete body and fills the defaults of a new exam', () => {
    const input = ExamInputSchema.parse(makeExamBody())

    expect(input).toMatchObject({ notes: '', heightMethod: 'vertical', readingPrecision: 'ruler', offsetModel: 'incline-adjusted' })
    expect(input).toMatchObject({ venousSigns: NO_VENOUS_SIGNS, venousConfirmed: false, context: [] })
  })

  it('when the patient code has a space, names the field and allows letters, digits and “-” only', () => {
    const result = ExamInputSchema.safeParse(makeExamBody({ patientCode: 'SM 0142' }))

    expect(messagesByField(result)).toEqual({ patientCode: ['Use letters, digits and “-” only (never a name)'] })
  })

  it('when the patient code is a name-like value over 40 characters, says 40 is the most', () => {
    const patientCode = 'Featherstonehaugh-Cholmondeley-Marjoribanks'

    const result = ExamInputSchema.safeParse(makeExamBody({ patientCode }))

    expect(patientCode.length).toBeGreaterThan(40)
    expect(messagesByField(result)).toEqual({ patientCode: ['A patient code is at most 40 characters'] })
  })

  it('trims spaces around the patient code', () => {
    const input = ExamInputSchema.parse(makeExamBody({ patientCode: '  SM-0142 ' }))

    expect(input.patientCode).toBe('SM-0142')
  })

  it('when the inclination is 91°, says 90° is the most', () => {
    const result = ExamInputSchema.safeParse(makeExamBody({ inclinationDeg: 91 }))

    expect(messagesByField(result)).toEqual({ inclinationDeg: ['Inclination is at most 90° (upright)'] })
  })

  it('when the column top is seen without a height, asks for the height', () => {
    const result = ExamInputSchema.safeParse(makeExamBody({ columnTop: 'seen', heightCm: undefined }))

    expect(messagesByField(result)).toEqual({ heightCm: ['Enter the height of the column top above the sternal angle'] })
  })

  it('when measured along the neck without the distance, asks for the distance', () => {
    const result = ExamInputSchema.safeParse(makeExamBody({ heightMethod: 'along-neck', heightCm: null }))

    expect(messagesByField(result)).toEqual({ alongNeckCm: ['Enter the distance measured along the neck'] })
  })

  it('when the column is not filled, lying flat, needs no height', () => {
    const result = ExamInputSchema.safeParse(makeExamBody({ columnTop: 'not-filled', heightCm: null, inclinationDeg: 0 }))

    expect(result.success).toBe(true)
  })

  it('reports every bad field at once', () => {
    const result = ExamInputSchema.safeParse(makeExamBody({ patientCode: 'SM 0142', inclinationDeg: 91, heightCm: undefined }))

    expect(Object.keys(messagesByField(result)).sort()).toEqual(['heightCm', 'inclinationDeg', 'patientCode'])
  })

  it('drops the keys only the server sets: estimate, status, version, examinerId', () => {
    const body = makeExamBody({ estimate: { cvpCmH2O: 99 }, status: 'countersigned', version: 7, examinerId: 'someone-else' })

    const input = ExamInputSchema.parse(body)

    expect(input).not.toHaveProperty('estimate')
    expect(input).not.toHaveProperty('status')
    expect(input).not.toHaveProperty('version')
    expect(input).not.toHaveProperty('examinerId')
  })
})

describe('ExamFindingsSchema', () => {
  it('reads the older list of venous signs as those signs present and the rest not tested', () => {
    const findings = ExamFindingsSchema.parse({ ...makeExamBody(), venousSigns: ['not-palpable', 'not-palpable'] })

    expect(findings.venousSigns).toEqual({ ...NO_VENOUS_SIGNS, 'not-palpable': 'present' })
  })

  it('takes the venous signs keyed by sign, an omitted sign not tested', () => {
    const findings = ExamFindingsSchema.parse({ ...makeExamBody(), venousSigns: { 'not-palpable': 'absent' } })

    expect(findings.venousSigns).toEqual({ ...NO_VENOUS_SIGNS, 'not-palpable': 'absent' })
  })

  it('keeps each context flag once', () => {
    const findings = ExamFindingsSchema.parse({ ...makeExamBody(), context: ['tense-ascites', 'tense-ascites'] })

    expect(findings.context).toEqual(['tense-ascites'])
  })

  it('accepts "no column even lying flat" at 10° and refuses it at 11°, on the column top', () => {
    const flat = ExamFindingsSchema.safeParse(makeExamBody({ columnTop: 'not-filled', heightCm: null, inclinationDeg: 10 }))

    const raised = ExamFindingsSchema.safeParse(makeExamBody({ columnTop: 'not-filled', heightCm: null, inclinationDeg: 11 }))

    expect(flat.success).toBe(true)
    expect(Object.keys(messagesByField(raised))).toEqual(['columnTop'])
  })

  it('refuses a reading along the neck below 30°, on the height method, and accepts it at 30°', () => {
    const along = { heightMethod: 'along-neck', alongNeckCm: 8, heightCm: null }

    const low = ExamFindingsSchema.safeParse(makeExamBody({ ...along, inclinationDeg: 29 }))

    expect(Object.keys(messagesByField(low))).toEqual(['heightMethod'])
    expect(ExamFindingsSchema.safeParse(makeExamBody({ ...along, inclinationDeg: 30 })).success).toBe(true)
  })

  it('accepts a column above the neck at any inclination', () => {
    expect(ExamFindingsSchema.safeParse(makeExamBody({ columnTop: 'above-neck', inclinationDeg: 20 })).success).toBe(true)
  })

  it('needs a reason for a column not assessable, and a text for "other"', () => {
    const none = ExamFindingsSchema.safeParse(makeExamBody({ columnTop: 'not-assessable', heightCm: null }))

    const other = ExamFindingsSchema.safeParse(makeExamBody({ columnTop: 'not-assessable', heightCm: null, notAssessableReason: 'other' }))

    expect(Object.keys(messagesByField(none))).toEqual(['notAssessableReason'])
    expect(Object.keys(messagesByField(other))).toEqual(['notAssessableText'])
  })
})

describe('StoredEstimateSchema', () => {
  it('reads a first-rules estimate in the current shape, numbers untouched, marked rules version 1', () => {
    const stored = {
      ...{ cvpCmH2O: 13.7, cvpMmHg: 10.08, bandCmH2O: [9.2, 18.2], bandMmHg: [6.8, 13.4], offsetCm: 9.7, offsetModel: 'incline-adjusted' },
      ...{ heightCm: 4, sigmaCm: 2.29, bound: 'point', elevated: true, category: 'high', confidence: 'indeterminate', observerSource: 'local' },
      ...{ outsideStudiedRange: false, venousSignCount: 1, mayBeArterial: true, caution: 'c', settingsVersion: 2 },
      hints: [{ code: 'cannon-a-waves', finding: 'Cannon a waves', consider: 'atrioventricular dissociation' }],
    }

    const estimate = StoredEstimateSchema.parse(stored)

    expect(estimate).toMatchObject({ rulesVersion: 1, cvpCmH2O: 13.7, bandCmH2O: [9.2, 18.2], sigmaCm: 2.29, categories: ['high'], settingsVersion: 2 })
    expect(estimate.observerSource).toBe('local-pairs')
    expect(estimate.cautions.map((c) => c.code)).toEqual(['few-venous-signs'])
    expect(estimate.prompts).toEqual([{ code: 'cannon-a-waves', finding: 'Cannon a waves', differential: ['atrioventricular dissociation'] }])
  })
})

describe('ExamPatchSchema', () => {
  it('keeps a partial waveform partial, so unsent waveform findings are not reset', () => {
    const patch = ExamPatchSchema.parse({ baseVersion: 2, waveform: { aWave: 'cannon' } })

    expect(patch.waveform).toEqual({ aWave: 'cannon' })
  })

  it('applies no defaults: a patch holds only what was sent', () => {
    const patch = ExamPatchSchema.parse({ baseVersion: 3, heightCm: 5 })

    expect(patch).toEqual({ baseVersion: 3, heightCm: 5 })
  })

  it('when the base version is missing, asks for it', () => {
    const result = ExamPatchSchema.safeParse({ heightCm: 5 })

    expect(messagesByField(result)).toEqual({ baseVersion: ['Send the version this change is based on'] })
  })

  it('drops an id, which a patch cannot change', () => {
    const patch = ExamPatchSchema.parse({ baseVersion: 1, id: 'another-id', notes: 'rechecked' })

    expect(patch).toEqual({ baseVersion: 1, notes: 'rechecked' })
  })
})
