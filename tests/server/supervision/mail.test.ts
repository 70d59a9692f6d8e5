import { pino } from 'pino'
import { afterEach, describe, expect, it } from 'vitest'
import { startFakeSmtp, type FakeSmtp } from '../../../server/mail/fake-smtp.ts'
import { createMailer, type Mailer } from '../../../server/mail/mailer.ts'
import { recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { act, makeWard, RE_EXAMINED, SIGN } from './ward.ts'

const cleanups: (() => unknown)[] = []

afterEach(async () => {
  for (const cleanup of cleanups.splice(0).reverse()) await cleanup()
})

async function fakeSmtp(port?: number): Promise<FakeSmtp> {
  const fake = await startFakeSmtp({ port })
  cleanups.push(() => fake.close())
  return fake
}

function mailerOn(port: number): Mailer {
  const mailer = createMailer({ host: '127.0.0.1', port, from: 't@x', log: pino({ level: 'silent' }), retryDelaysMs: [20], maxAttempts: 500 })
  cleanups.push(() => mailer.close())
  return mailer
}

/** The app wired to a real SMTP conversation with a fake server, and a ward with a resident and an attending. */
async function wardWithMail() {
  const fake = await fakeSmtp()
  const mailer = mailerOn(fake.port)
  const { app } = await makeTestApp({ mailer })
  return { fake, mailer, app, ...(await makeWard()) }
}

describe('workflow e-mail', () => {
  it('on submission, asks the ward’s attending to countersign, and nobody else', async () => {
    const { fake, mailer, app, team, resident, attending } = await wardWithMail()
    await makeCaller({ teamIds: [team.id] })
    const amu = await makeTeam('Acute Medical Unit')
    await makeCaller({ roles: ['attending'], teamIds: [amu.id] })
    const exam = await recordExam(app, resident.auth, { teamId: team.id })

    const res = await act(app, resident.auth, exam, 'submit')
    await mailer.idle()

    expect(res.status).toBe(200)
    expect(fake.messages()).toHaveLength(1)
    expect(fake.messages()[0]).toMatchObject({ to: [attending.user.email], subject: 'Countersignature requested by Dr Sam Whitcombe' })
    expect(fake.messages()[0]!.text).toContain(`/exams/${exam.id}`)
  })

  it('does not ask an attending to countersign their own submission', async () => {
    const { fake, mailer, app, team, attending } = await wardWithMail()
    const colleague = await makeCaller({ roles: ['attending'], teamIds: [team.id] })

    await recordSubmittedExam(app, attending.auth, { teamId: team.id })
    await mailer.idle()

    expect(fake.messages().map((m) => m.to)).toEqual([[colleague.user.email]])
  })

  it('on return, tells the resident with the comment, the patient code blanked out', async () => {
    const { fake, mailer, app, team, resident, attending } = await wardWithMail()
    const exam = await recordSubmittedExam(app, resident.auth, { teamId: team.id, patientCode: 'SM-0157' })
    await mailer.idle()
    fake.clear()

    await act(app, attending.auth, exam, 'return', { comment: 'SM-0157: measure from the sternal angle' })
    await mailer.idle()

    const [message] = fake.messages()
    expect(message).toMatchObject({ to: [resident.user.email], subject: 'Exam returned by Dr Tomas Lindqvist' })
    expect(message!.text).toContain('measure from the sternal angle')
    expect(message!.text).not.toContain('SM-0157')
  })

  it('on countersignature, tells the resident who signed and with what meaning', async () => {
    const { fake, mailer, app, team, resident, attending } = await wardWithMail()
    const exam = await recordSubmittedExam(app, resident.auth, { teamId: team.id })
    await mailer.idle()
    fake.clear()

    await act(app, attending.auth, exam, 'countersign', RE_EXAMINED)
    await mailer.idle()

    const [message] = fake.messages()
    expect(message).toMatchObject({ to: [resident.user.email], subject: 'Exam countersigned by Dr Tomas Lindqvist' })
    expect(message!.text).toContain('meaning: reviewed after re-examining the patient')
  })

  it('on countersignature with a reading and feedback, gives the resident the reading, the difference and the feedback', async () => {
    const { fake, mailer, app, team, resident, attending } = await wardWithMail()
    const exam = await recordSubmittedExam(app, resident.auth, { teamId: team.id, patientCode: 'SM-0160' })
    await mailer.idle()
    fake.clear()
    const feedback = { feedback: ['read-peak-not-mean', 'other'], feedbackText: 'Sit SM-0160 up a little more next time' }

    await act(app, attending.auth, exam, 'countersign', { ...RE_EXAMINED, ...feedback })
    await mailer.idle()

    const text = fake.messages()[0]!.text
    // Resident h = 4 cm, attending h = 6 cm, both at 45° with the same offset: 4 − 6 = −2 cmH₂O.
    expect(text).toContain('column top 6.0 cm above the sternal angle at 45.0°')
    expect(text).toContain('your estimate minus theirs: −2.0 cmH₂O')
    expect(text).toContain('Read the mean level of the column, not its peak')
    expect(text).toContain('Sit [patient code removed] up a little more next time')
    expect(text).not.toContain('SM-0160')
  })

  it('sends nothing when the countersignature is refused', async () => {
    const { fake, mailer, app, team, resident, attending } = await wardWithMail()
    const exam = await recordSubmittedExam(app, resident.auth, { teamId: team.id })
    await mailer.idle()
    fake.clear()

    await act(app, attending.auth, exam, 'countersign', { ...SIGN, password: 'wrong' })
    await mailer.idle()

    expect(fake.messages()).toEqual([])
  })

  it('when the SMTP server is down, the submission still succeeds and the message goes out once it is back', async () => {
    const down = await startFakeSmtp()
    await down.close()
    const mailer = mailerOn(down.port)
    const { app } = await makeTestApp({ mailer })
    const { team, resident, attending } = await makeWard()
    const exam = await recordExam(app, resident.auth, { teamId: team.id })

    const res = await act(app, resident.auth, exam, 'submit')
    const pendingWhileDown = mailer.pending()
    const back = await fakeSmtp(down.port)
    await mailer.idle()

    expect(res.status).toBe(200)
    expect(res.body.status).toBe('submitted')
    expect(pendingWhileDown).toBe(1)
    expect(back.messages().map((m) => [m.to, m.subject])).toEqual([[[attending.user.email], 'Countersignature requested by Dr Sam Whitcombe']])
  })
})
