import { Op, type Transaction } from 'sequelize'
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

/**
 * Workflow e-mails, stored in the durable outbox: inside `transaction` when the caller passes the action's own (the
 * message then leaves only if the action commits), else at once. A failure is logged and never reaches the caller.
 */
export interface Notifier {
  submitted(exam: Exam, transaction?: Transaction): Promise<void>
  returned(exam: Exam, reviewer: User, transaction?: Transaction): Promise<void>
  countersigned(exam: Exam, signature: Signature, transaction?: Transaction): Promise<void>
}

export interface NotifierOptions extends MailDeps {
  log: Logger
}

/** E-mail addresses of the team's active attendings, but not the exam's author. */
async function attendingsOf(teamId: string, exceptId: string): Promise<string[]> {
  const users = await UserModel.findAll({ where: { id: { [Op.in]: [...(await membersOf([teamId]))] }, active: true } })
  return users.filter((u) => u.id !== exceptId && rolesOf(u).includes('attending')).map((u) => u.email)
}

async function emailOf(userId: string, transaction?: Transaction): Promise<string | null> {
  const user = await UserModel.findByPk(userId, { transaction })
  return user?.active ? user.email : null
}

const refOf = ({ id, examinedAt, teamName, patientCode }: Exam): ExamRef => ({ id, examinedAt, teamName, patientCode })

export function createNotifier({ mailer, log, baseUrl }: NotifierOptions): Notifier {
  const queue = async (template: string, build: () => Promise<MailMessage | null>, transaction?: Transaction) => {
    if (!mailer) return
    try {
      const message = await build()
      if (message) await mailer.enqueue(message, { transaction })
    } catch (err) {
      // The name only: a message could quote an address.
      log.error({ template, error: (err as Error)?.name }, 'e-mail not queued')
    }
  }
  return {
    submitted: (exam, transaction) =>
      queue(
        'countersign-requested',
        async () => {
          const to = await attendingsOf(exam.teamId, exam.examinerId)
          return countersignRequested({ baseUrl, to, residentName: exam.examinerName, exam: refOf(exam) })
        },
        transaction,
      ),
    returned: (exam, reviewer, transaction) =>
      queue(
        'exam-returned',
        async () => {
          const to = await emailOf(exam.examinerId, transaction)
          const comment = exam.returnComment ?? ''
          return to ? examReturned({ baseUrl, to, attendingName: reviewer.displayName, comment, exam: refOf(exam) }) : null
        },
        transaction,
      ),
    countersigned: (exam, s, transaction) =>
      queue(
        'exam-countersigned',
        async () => {
          const to = await emailOf(exam.examinerId, transaction)
          const { signerName, meaning, signedAt, timeZone } = s
          const teaching = teachingText(s)
          return to ? examCountersigned({ baseUrl, timeZone, to, signerName, meaning, signedAt, exam: refOf(exam), teaching }) : null
        },
        transaction,
      ),
  }
}
