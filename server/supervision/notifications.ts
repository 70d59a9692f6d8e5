import { Op } from 'sequelize'
import type { Logger } from 'pino'
import type { Exam } from '#shared/schemas/exam'
import type { Signature } from '#shared/schemas/signature'
import type { User } from '#shared/schemas/user'
import type { MailDeps, MailMessage } from '../mail/mailer.ts'
import { countersignRequested, examCountersigned, examReturned, type ExamRef } from '../mail/templates.ts'
import { teachingText } from './teaching-text.ts'
import { UserModel } from '../models/index.ts'
import { membersOf } from '../users/team-members.ts'
import { rolesOf } from '../users/users.service.ts'

/** Workflow e-mails, sent after the action committed; a failure is logged and never reaches the caller. */
export interface Notifier {
  submitted(exam: Exam): Promise<void>
  returned(exam: Exam, reviewer: User): Promise<void>
  countersigned(exam: Exam, signature: Signature): Promise<void>
}

export interface NotifierOptions extends MailDeps {
  log: Logger
}

/** E-mail addresses of the team's active attendings, but not the exam's author. */
async function attendingsOf(teamId: string, exceptId: string): Promise<string[]> {
  const users = await UserModel.findAll({ where: { id: { [Op.in]: [...(await membersOf([teamId]))] }, active: true } })
  return users.filter((u) => u.id !== exceptId && rolesOf(u).includes('attending')).map((u) => u.email)
}

async function emailOf(userId: string): Promise<string | null> {
  const user = await UserModel.findByPk(userId)
  return user?.active ? user.email : null
}

const refOf = ({ id, examinedAt, teamName, patientCode }: Exam): ExamRef => ({ id, examinedAt, teamName, patientCode })

export function createNotifier({ mailer, log, baseUrl }: NotifierOptions): Notifier {
  const queue = async (template: string, build: () => Promise<MailMessage | null>) => {
    if (!mailer) return
    try {
      const message = await build()
      if (message) mailer.send(message)
    } catch (err) {
      // The name only: a message could quote an address.
      log.error({ template, error: (err as Error)?.name }, 'e-mail not queued')
    }
  }
  return {
    submitted: (exam) =>
      queue('countersign-requested', async () => {
        const to = await attendingsOf(exam.teamId, exam.examinerId)
        return countersignRequested({ baseUrl, to, residentName: exam.examinerName, exam: refOf(exam) })
      }),
    returned: (exam, reviewer) =>
      queue('exam-returned', async () => {
        const to = await emailOf(exam.examinerId)
        const comment = exam.returnComment ?? ''
        return to ? examReturned({ baseUrl, to, attendingName: reviewer.displayName, comment, exam: refOf(exam) }) : null
      }),
    countersigned: (exam, s) =>
      queue('exam-countersigned', async () => {
        const to = await emailOf(exam.examinerId)
        const { signerName, meaning, signedAt, timeZone } = s
        const teaching = teachingText(s)
        return to ? examCountersigned({ baseUrl, timeZone, to, signerName, meaning, signedAt, exam: refOf(exam), teaching }) : null
      }),
  }
}
