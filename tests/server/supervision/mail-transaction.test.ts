import { pino } from 'pino'
import { afterEach, describe, expect, it } from 'vitest'
import { createMailer, type Mailer } from '../../../server/mail/mailer.ts'
import request from 'supertest'
import { recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { makeTestApp } from '../helpers.ts'
import { cleanupList, fakeSmtp, outboxRows } from '../mail/outbox-harness.ts'
import { act, makeWard, recordOf, RE_EXAMINED } from './ward.ts'

const cleanups = cleanupList()
afterEach(() => cleanups.run())

/**
 * A mailer that, once armed, stores the message in the caller's transaction and then fails, as any later step of the
 * action could.
 */
function failingAfterQueueing(mailer: Mailer, armed: () => boolean): Mailer {
  return {
    ...mailer,
    enqueue: async (message, options) => {
      await mailer.enqueue(message, options)
      if (armed()) throw new Error('the action failed after its e-mail was queued')
    },
  }
}

/**
 * The app with a mailer on the test's database (the models' own, found when it first stores) delivering to a fake SMTP
 * server, and a submitted exam of the ward's resident.
 */
async function submittedWithMail(failing: boolean) {
  const fake = await fakeSmtp(cleanups)
  const mailer = createMailer({ host: '127.0.0.1', port: fake.port, from: 't@x', log: pino({ level: 'silent' }), retryDelaysMs: [20] })
  cleanups.add(() => mailer.close())
  let armed = false
  const { app, sequelize } = await makeTestApp({ mailer: failing ? failingAfterQueueing(mailer, () => armed) : mailer })
  const ward = await makeWard()
  const exam = await recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id })
  await mailer.idle()
  armed = true
  const toResident = async () => (await outboxRows(sequelize)).filter((r) => r.recipient === ward.resident.user.email)
  return { app, fake, mailer, exam, toResident, ...ward }
}

describe.each([
  ['POST /api/exams/:id/countersign', 'countersign', RE_EXAMINED],
  ['POST /api/exams/:id/return', 'return', { comment: 'Measure again from the sternal angle' }],
])('%s and its e-mail to the resident', (_route, action, body) => {
  it('when the action commits, its transaction holds exactly one message to the resident, which is delivered', async () => {
    const { app, fake, mailer, exam, resident, attending, toResident } = await submittedWithMail(false)

    const res = await act(app, attending.auth, exam, action, body)
    await mailer.idle()

    expect(res.status).toBe(200)
    expect(await toResident()).toHaveLength(1)
    expect(fake.messages().filter((m) => m.to.includes(resident.user.email))).toHaveLength(1)
  })

  it('when the action fails after its message was queued, rolls both back: no message row remains and nothing is sent', async () => {
    const { app, fake, mailer, exam, resident, attending, toResident } = await submittedWithMail(true)
    const before = await recordOf(exam.id)

    const res = await act(app, attending.auth, exam, action, body)
    await mailer.idle()

    expect(res.status).toBe(500)
    expect(await recordOf(exam.id)).toEqual(before)
    expect(await toResident()).toEqual([])
    expect(fake.messages().filter((m) => m.to.includes(resident.user.email))).toEqual([])
  })
})

describe('POST /api/exams/:id/submit and its countersign request to the attendings', () => {
  async function draftWithMail(failing: boolean) {
    const fake = await fakeSmtp(cleanups)
    const mailer = createMailer({ host: '127.0.0.1', port: fake.port, from: 't@x', log: pino({ level: 'silent' }), retryDelaysMs: [20] })
    cleanups.add(() => mailer.close())
    const { app, sequelize } = await makeTestApp({ mailer: failing ? failingAfterQueueing(mailer, () => true) : mailer })
    const ward = await makeWard()
    const exam = await recordExam(app, ward.resident.auth, { teamId: ward.team.id })
    const toAttending = async () => (await outboxRows(sequelize)).filter((r) => r.recipient === ward.attending.user.email)
    const submit = () => request(app).post(`/api/exams/${exam.id}/submit`).set('Authorization', ward.resident.auth).send({ baseVersion: exam.version })
    return { fake, mailer, exam, submit, toAttending, ...ward }
  }

  it('when the submission commits, its transaction holds one request to the attending, which is delivered', async () => {
    const { fake, mailer, submit, attending, toAttending } = await draftWithMail(false)

    const res = await submit()
    await mailer.idle()

    expect(res.status).toBe(200)
    expect(await toAttending()).toHaveLength(1)
    expect(fake.messages().filter((m) => m.to.includes(attending.user.email))).toHaveLength(1)
  })

  it('when the submission fails after its request was queued, rolls both back: the exam stays a draft and nothing is sent', async () => {
    const { fake, mailer, exam, submit, attending, toAttending } = await draftWithMail(true)

    const res = await submit()
    await mailer.idle()

    expect(res.status).toBe(500)
    expect((await recordOf(exam.id)).status).toBe('draft')
    expect(await toAttending()).toEqual([])
    expect(fake.messages().filter((m) => m.to.includes(attending.user.email))).toEqual([])
  })
})
