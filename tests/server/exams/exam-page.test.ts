import { randomUUID } from 'node:crypto'
import { beforeEach, describe, expect, it } from 'vitest'
import { ExamSchema } from '#shared/schemas/exam'
import { presentPage } from '../../../server/exams/exam-page.ts'
import { ExamModel } from '../../../server/models/index.ts'
import { recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { FIRST_RULES_ESTIMATE } from '../factories/first-rules.ts'
import { makeTestApp } from '../helpers.ts'
import { act, makeWard, SIGN } from '../supervision/ward.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

/** A row as the first release stored it: the venous signs a list, a first-rules estimate, no later columns. */
async function storeFirstReleaseRow(examinerId: string, teamId: string): Promise<void> {
  const at = new Date('2026-11-30T10:00:00.000Z')
  await ExamModel.sequelize!.getQueryInterface().bulkInsert('exams', [
    {
      ...{ id: randomUUID(), patientCode: 'SM-0142', teamId, examinerId, examinedAt: at, notes: 'SM-0142 large v waves' },
      ...{ inclinationDeg: 45, inclinationSource: 'entered', vein: 'right-internal', columnTop: 'seen', heightMethod: 'vertical' },
      ...{ heightCm: 4, alongNeckCm: null, readingPrecision: 'ruler', offsetModel: 'incline-adjusted', rhythm: 'sinus' },
      venousSigns: JSON.stringify(['not-palpable', 'double-peaked']),
      waveform: JSON.stringify({ aWave: 'normal', vWave: 'large', yDescent: 'normal' }),
      ...{ respiratory: 'falls-on-inspiration', abdominojugular: JSON.stringify({ done: false }), status: 'submitted', version: 3 },
      ...{
        estimate: JSON.stringify(FIRST_RULES_ESTIMATE),
        verticalHeightCm: 4,
        cvpCmH2O: 13.7,
        submittedAt: at,
        createdAt: at,
        updatedAt: at,
      },
    },
  ])
}

/** Every kind of stored exam: a draft, a not-assessable one, countersigned, returned with a comment, a first-release row. */
async function everyKind() {
  const { team, resident, attending } = await makeWard()
  await recordExam(app, resident.auth, { teamId: team.id, notes: 'Seen with SM-0142 sitting up', context: ['tense-ascites'] })
  const text = { notAssessableReason: 'other', notAssessableText: 'SM-0142 agitated' } as const
  await recordExam(app, resident.auth, { teamId: team.id, columnTop: 'not-assessable', heightCm: null, ...text })
  await act(app, attending.auth, await recordSubmittedExam(app, resident.auth, { teamId: team.id }), 'countersign', SIGN).expect(200)
  await act(app, attending.auth, await recordSubmittedExam(app, resident.auth, { teamId: team.id }), 'return', {
    comment: 'Recheck SM-0142',
  })
  await storeFirstReleaseRow(resident.user.id, team.id)
  return ExamModel.findAll({ order: [['syncSeq', 'ASC']] })
}

describe('presentPage', () => {
  // Pages skip parsing what was checked when it was stored: each answer must still be exactly what the schema reads.
  it('answers each kind of stored exam already in the shape the exam schema reads, codes shown', async () => {
    const rows = await everyKind()

    const page = await presentPage(rows, (row) => row.patientCode)

    expect(rows).toHaveLength(5)
    expect(page).toEqual(page.map((exam) => ExamSchema.parse(exam)))
    expect(page.map((exam) => exam.notes)).toContain('Seen with SM-0142 sitting up')
  })

  it('for a reader who sees pseudonyms, answers the schema shape with no free text and no code anywhere', async () => {
    const rows = await everyKind()
    const masked = () => 'P-1a2b3c4d'

    const page = await presentPage(rows, masked)

    expect(page).toEqual(page.map((exam) => ExamSchema.parse(exam)))
    expect(page.every((exam) => exam.notes === '' && !exam.notAssessableText && !exam.returnComment)).toBe(true)
    expect(JSON.stringify(page)).not.toContain('SM-0142')
  })
})
