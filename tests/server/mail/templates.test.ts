import { describe, expect, it } from 'vitest'
import type { MailMessage } from '../../../server/mail/mailer.ts'
import {
  countersignRequested,
  examCountersigned,
  examReturned,
  invitation,
  passwordReset,
  roundOpened,
  type ExamRef,
} from '../../../server/mail/templates.ts'

const BASE = { baseUrl: 'https://plumbline.example.org/', timeZone: 'Europe/Paris', locale: 'en-GB' }
const PATIENT_CODE = 'MRN-88412'
const AID = /aid to the bedside exam; clinical judgement decides/

function makeExam(overrides: Partial<ExamRef> = {}): ExamRef {
  return { id: 'exam-42', examinedAt: '2026-12-03T09:30:00Z', teamName: 'Ward 7', patientCode: PATIENT_CODE, ...overrides }
}

function examMessages(exam = makeExam()): MailMessage[] {
  return [
    countersignRequested({ ...BASE, to: ['att@example.test'], residentName: 'Dr Rao', exam }),
    examReturned({ ...BASE, to: 'res@example.test', attendingName: 'Dr Hale', comment: `Recheck ${PATIENT_CODE.toLowerCase()} sitting up.`, exam }),
    examCountersigned({ ...BASE, to: 'res@example.test', signerName: 'Dr Hale', meaning: 'reviewed-agree', signedAt: '2026-12-03T13:05:00Z', exam }),
  ]
}

describe('e-mail templates', () => {
  it('asks the team attendings to countersign, naming the resident, the date and team, and linking the exam', () => {
    const message = countersignRequested({ ...BASE, to: ['a1@example.test', 'a2@example.test'], residentName: 'Dr Rao', exam: makeExam() })

    expect(message.to).toEqual(['a1@example.test', 'a2@example.test'])
    expect(message.subject).toBe('Countersignature requested by Dr Rao')
    expect(message.text).toContain('an exam recorded on 3 Dec 2026 in Ward 7')
    expect(message.text).toContain('https://plumbline.example.org/exams/exam-42')
  })

  it('tells the resident their exam was returned, with the attending comment', () => {
    const message = examReturned({ ...BASE, to: 'res@example.test', attendingName: 'Dr Hale', comment: 'Measure from the sternal angle.', exam: makeExam() })

    expect(message.to).toEqual(['res@example.test'])
    expect(message.subject).toBe('Exam returned by Dr Hale')
    expect(message.text).toContain('Measure from the sternal angle.')
  })

  it('tells the resident who countersigned, with the meaning and the time with its time zone', () => {
    const message = examCountersigned({
      ...BASE,
      to: 'res@example.test',
      signerName: 'Dr Hale',
      meaning: 'reviewed-re-examined',
      signedAt: '2026-12-03T13:05:00Z',
      exam: makeExam(),
    })

    expect(message.subject).toBe('Exam countersigned by Dr Hale')
    expect(message.text).toContain('Signed by Dr Hale, 3 Dec 2026, 14:05 CET (Europe/Paris), meaning: reviewed after re-examining the patient.')
  })

  it('never puts the patient code in an e-mail, not even when an attending typed it into a comment', () => {
    const messages = examMessages()

    for (const { subject, text } of messages) expect(`${subject}\n${text}`.toLowerCase()).not.toContain(PATIENT_CODE.toLowerCase())
    expect(messages[1]!.text).toContain('Recheck [patient code removed] sitting up.')
  })

  it('reminds the reader that the estimate is an aid wherever an e-mail is about exams', () => {
    const messages = [...examMessages(), roundOpened({ ...BASE, to: ['e@example.test'], educatorName: 'Dr Lim', roundName: 'December', roundId: 'r1' })]

    for (const message of messages) expect(message.text).toMatch(AID)
  })

  it('invites a new account holder with a one-time link whose token stays out of server logs', () => {
    const message = invitation({ ...BASE, to: 'new@example.test', inviterName: 'Dr Lim', displayName: 'Sam', token: 'tok 1', expiresAt: '2026-12-10T12:00:00Z' })

    expect(message).toMatchObject({ template: 'invitation', to: ['new@example.test'], subject: 'Dr Lim invites you to Plumbline' })
    expect(message.text).toContain('https://plumbline.example.org/invitation#token=tok%201')
    expect(message.text).toContain('until 10 Dec 2026, 13:00 CET (Europe/Paris)')
  })

  it('sends a password reset link to the account holder alone', () => {
    const message = passwordReset({ ...BASE, to: 'res@example.test', token: 'abc', expiresAt: '2026-12-03T14:00:00Z' })

    expect(message).toMatchObject({ template: 'password-reset', to: ['res@example.test'], subject: 'Reset your Plumbline password' })
    expect(message.text).toContain('https://plumbline.example.org/reset-password#token=abc')
  })

  it('announces a calibration round to its examiners, saying readings stay blinded until it closes', () => {
    const message = roundOpened({ ...BASE, to: ['e1@example.test', 'e2@example.test'], educatorName: 'Dr Lim', roundName: 'December', roundId: 'r1' })

    expect(message).toMatchObject({ template: 'round-opened', to: ['e1@example.test', 'e2@example.test'], subject: 'Calibration round open: December' })
    expect(message.text).toContain("see the others' readings only once the round closes")
    expect(message.text).toContain('https://plumbline.example.org/rounds/r1')
  })

  it('writes dates in the locale it is given, with the zone of the signer beside the time', () => {
    const context = { ...BASE, locale: 'en-US', to: 'r@example.test', signerName: 'Dr Hale', meaning: 'reviewed-agree' as const }

    const signed = examCountersigned({ ...context, signedAt: '2026-12-03T13:05:00Z', exam: makeExam() })

    // en-US orders month before day and names the zone by its offset (Unicode CLDR); the 24-hour clock and the IANA zone stay.
    expect(signed.text).toContain('Signed by Dr Hale, Dec 3, 2026, 14:05 GMT+1 (Europe/Paris)')
    expect(signed.text).toContain('an exam recorded on Dec 3, 2026 in Ward 7')
  })
})
