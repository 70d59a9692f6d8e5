import { randomUUID } from 'node:crypto'
import { pino } from 'pino'
import request from 'supertest'
import type { Sequelize } from 'sequelize'
import { beforeEach, describe, expect, it } from 'vitest'
import { ExamSchema, type Exam } from '#shared/schemas/exam'
import { createApp } from '../../../server/app.ts'
import { createMigrator } from '../../../server/db/migrator.ts'
import { sortedJson } from '../../../server/exams/exam-columns.ts'
import { initModels } from '../../../server/models/index.ts'
import { sha256 } from '../../../server/supervision/signed-content.ts'
import { FIRST_RULES_ESTIMATE } from '../factories/first-rules.ts'
import { makeCaller, makeTeam, TEST_SECRET, openBlankDatabase } from '../helpers.ts'
import { columnNames, triggerNames } from '../db/schema-snapshot.ts'

const BEFORE = '2026.12.08T10.00.00.user-roles'
const MIGRATION = '2026.12.09T09.00.00.venous-context'
const NEW_COLUMNS = ['venousConfirmed', 'notAssessableReason', 'notAssessableText', 'context']

/** The record fields as the first release stored them: the venous signs a list of those present. */
function firstReleaseFields(id: string, teamId: string): Record<string, unknown> {
  return {
    id,
    patientCode: 'SM-0142',
    teamId,
    examinedAt: '2026-11-30T09:00:00.000Z',
    notes: 'Large v waves',
    inclinationDeg: 45,
    inclinationSource: 'entered',
    vein: 'right-internal',
    columnTop: 'seen',
    heightMethod: 'vertical',
    heightCm: 4,
    alongNeckCm: null,
    readingPrecision: 'ruler',
    offsetModel: 'incline-adjusted',
    venousSigns: ['not-palpable', 'double-peaked', 'falls-on-inspiration'],
    rhythm: 'sinus',
    waveform: { aWave: 'normal', vWave: 'large', yDescent: 'normal' },
    respiratory: 'falls-on-inspiration',
    abdominojugular: { done: false },
  }
}

let sequelize: Sequelize
let app: ReturnType<typeof createApp>

beforeEach(async () => {
  sequelize = await openBlankDatabase()
  const models = initModels(sequelize)
  await createMigrator(sequelize).up({ to: BEFORE })
  app = createApp({ sequelize, models, secret: TEST_SECRET, log: pino({ level: 'silent' }), demo: false, cookieSecure: false, baseUrl: 'https://plumbline.test' })
})

/** A countersigned exam written as the first release wrote it, with its signature over that content. */
async function storeFirstReleaseExam(changes: Record<string, unknown> = {}, status = 'countersigned') {
  const team = await makeTeam()
  const author = await makeCaller({ teamIds: [team.id] })
  const attending = await makeCaller({ roles: ['attending'], teamIds: [team.id] })
  const fields = { ...firstReleaseFields(randomUUID(), team.id), ...changes }
  const id = fields.id as string
  const at = new Date('2026-11-30T10:00:00.000Z')
  const json = (value: unknown) => JSON.stringify(value)
  await sequelize.getQueryInterface().bulkInsert('exams', [
    {
      ...fields,
      examinedAt: new Date(fields.examinedAt as string),
      venousSigns: json(fields.venousSigns),
      waveform: json(fields.waveform),
      abdominojugular: json(fields.abdominojugular),
      examinerId: author.user.id,
      status,
      version: 3,
      estimate: json(FIRST_RULES_ESTIMATE),
      verticalHeightCm: 4,
      cvpCmH2O: 13.7,
      submittedAt: at,
      createdAt: at,
      updatedAt: at,
    },
  ])
  const content = sortedJson({ ...fields, examinerId: author.user.id, version: 3, estimate: FIRST_RULES_ESTIMATE })
  const signature = { id: randomUUID(), examId: id, examVersion: 3, signerId: attending.user.id, signerName: 'Dr Tomas Lindqvist' }
  await sequelize.getQueryInterface().bulkInsert('signatures', [
    { ...signature, meaning: 'reviewed-agree', signedAt: at, content, contentHash: sha256(content), supersededAt: null },
  ])
  return { id, author }
}

const columnsOfExams = () => columnNames(sequelize, 'exams')

describe(`migration ${MIGRATION}`, () => {
  it('keeps an exam of the first release readable: the estimate as saved (rules version 1), the signs as states, the signature valid', async () => {
    const { id, author } = await storeFirstReleaseExam()
    await createMigrator(sequelize).up()

    const res = await request(app).get(`/api/exams/${id}`).set('Authorization', author.auth)

    expect(res.status).toBe(200)
    const exam = res.body as Exam
    expect(exam.estimate).toMatchObject({
      rulesVersion: 1,
      cvpCmH2O: FIRST_RULES_ESTIMATE.cvpCmH2O,
      cvpMmHg: FIRST_RULES_ESTIMATE.cvpMmHg,
      bandCmH2O: FIRST_RULES_ESTIMATE.bandCmH2O,
      bandMmHg: FIRST_RULES_ESTIMATE.bandMmHg,
      sigmaCm: FIRST_RULES_ESTIMATE.sigmaCm,
      categories: ['high'],
      observerSource: 'local-pairs',
      elevated: true,
    })
    expect(exam.estimate.settingsVersion).toBeUndefined()
    expect(exam.venousSigns).toEqual({
      'not-palpable': 'present',
      'double-peaked': 'present',
      'falls-on-inspiration': 'present',
      'changes-with-position': 'not-tested',
      'rises-with-abdominal-pressure': 'not-tested',
      'obliterated-by-light-pressure': 'not-tested',
    })
    expect(exam).toMatchObject({ venousConfirmed: false, context: [], status: 'countersigned', version: 3 })
    expect(exam.signatures).toEqual([expect.objectContaining({ valid: true, superseded: false })])
  })

  it('answers that exam in a shape the shared exam schema reads again, as a device reads what it pulls', async () => {
    const { id, author } = await storeFirstReleaseExam()
    await createMigrator(sequelize).up()

    const res = await request(app).get(`/api/exams/${id}`).set('Authorization', author.auth)

    const parsed = ExamSchema.safeParse(res.body)
    expect(parsed.error?.issues ?? []).toEqual([])
    expect(parsed.data?.estimate).toEqual(res.body.estimate)
  })

  it('keeps readable an exam the current rules would refuse: "no column even lying flat" recorded at 40°', async () => {
    const { id, author } = await storeFirstReleaseExam({ columnTop: 'not-filled', heightCm: null, inclinationDeg: 40, venousSigns: [] })
    await createMigrator(sequelize).up()

    const res = await request(app).get(`/api/exams/${id}`).set('Authorization', author.auth)
    const list = await request(app).get('/api/exams').set('Authorization', author.auth)

    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ columnTop: 'not-filled', inclinationDeg: 40 })
    expect(res.body.estimate.cvpCmH2O).toBe(FIRST_RULES_ESTIMATE.cvpCmH2O)
    expect(list.body.exams.map((e: Exam) => e.id)).toEqual([id])
  })

  it('keeps a first-release draft saved again without a change exactly as it was: same version, same estimate', async () => {
    const { id, author } = await storeFirstReleaseExam({}, 'draft')
    await createMigrator(sequelize).up()

    const res = await request(app).patch(`/api/exams/${id}`).set('Authorization', author.auth).send({ heightCm: 4, baseVersion: 3 })

    expect(res.status).toBe(200)
    expect(res.body.version).toBe(3)
    expect(res.body.estimate).toMatchObject({ rulesVersion: 1, cvpCmH2O: FIRST_RULES_ESTIMATE.cvpCmH2O, bandCmH2O: FIRST_RULES_ESTIMATE.bandCmH2O })
    const [[row]] = (await sequelize.query(`SELECT estimate, version FROM exams WHERE id = '${id}'`)) as [Record<string, unknown>[], unknown]
    expect(row).toEqual({ estimate: JSON.stringify(FIRST_RULES_ESTIMATE), version: 3 })
  })

  it('adds the new columns with their defaults and leaves the stored estimate text untouched', async () => {
    const { id } = await storeFirstReleaseExam()
    const [[before]] = (await sequelize.query(`SELECT estimate, "venousSigns" FROM exams WHERE id = '${id}'`)) as [Record<string, string>[], unknown]

    await createMigrator(sequelize).up()

    const [[after]] = (await sequelize.query(`SELECT * FROM exams WHERE id = '${id}'`)) as [Record<string, unknown>[], unknown]
    expect(after).toMatchObject({ estimate: before!.estimate, venousSigns: before!.venousSigns, context: '[]' })
    // 0 on SQLite, false on PostgreSQL.
    expect(Number(after!.venousConfirmed)).toBe(0)
    expect(after!.notAssessableReason).toBeNull()
    expect(after!.notAssessableText).toBeNull()
  })

  it('goes down and up again, keeping the rows and the sync-cursor triggers', async () => {
    const { id } = await storeFirstReleaseExam()
    const migrator = createMigrator(sequelize)
    await migrator.up()

    await migrator.down({ to: MIGRATION })
    const down = await columnsOfExams()
    await migrator.up()
    const up = await columnsOfExams()

    for (const column of NEW_COLUMNS) expect(down).not.toContain(column)
    for (const column of NEW_COLUMNS) expect(up).toContain(column)
    expect(await triggerNames(sequelize, 'exams')).toEqual(expect.arrayContaining(['exams_sync_seq_insert', 'exams_sync_seq_update']))
    const [rows] = (await sequelize.query(`SELECT id FROM exams WHERE id = '${id}'`)) as [unknown[], unknown]
    expect(rows).toHaveLength(1)
  })
})
