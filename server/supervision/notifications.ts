import { Op, type Transaction } from 'sequelize'
import type { Logger } from 'pino'
import type { User } from '#shared/schemas/user'
import type { MailDeps, MailMessage } from '../mail/mailer.ts'
import { countersignRequested, examCountersigned, examReturned, type ExamRef } from '../mail/templates.ts'
import { teachingText } from './teaching-text.ts'
import { UserModel, type ExamModel, type SignatureModel } from '../models/index.ts'
import { membersOf } from '../users/team-members.ts'
import { rolesOf } from '../users/users.service.ts'
import { noticeExamOf, signatureNotice, type NoticeExam } from './notice-exam.ts'

/**
 * Workflow e-mails, stored in the durable outbox. Given the action's transaction, the message is read and stored in it,
 * so it leaves only if the action commits, and a failure to store it fails the action (on PostgreSQL a failed statement
 * has already spoilt the transaction). Without one (after the action committed) it is stored at once, and a failure is
 * logged and never reaches the caller.
 */
export interface Notifier {
  /** To the team's attendings: the exam as presented after the commit, or its row inside the submitting transaction. */
  submitted(exam: NoticeExam | ExamModel, transaction?: Transaction): Promise<void>
  /** To the author, inside the returning transaction. */
  returned(row: ExamModel, reviewer: User, transaction: Transaction): Promise<void>
  /** To the author, inside the signing transaction, with the attending's reading and feedback. */
  countersigned(row: ExamModel, signature: SignatureModel, transaction: Transaction): Promise<void>
}

export interface NotifierOptions extends MailDeps {
  log: Logger
}

/** E-mail addresses of the team's active attendings, but not the exam's author. */
async function attendingsOf(teamId: string, exceptId: string, transaction?: Transaction): Promise<string[]> {
  const members = [...(await membersOf([teamId], transaction))]
  const users = await UserModel.findAll({ where: { id: { [Op.in]: members }, active: true }, transaction })
  return users.filter((u) => u.id !== exceptId && rolesOf(u).includes('attending')).map((u) => u.email)
}

async function emailOf(userId: string, transaction: Transaction): Promise<string | null> {
  const user = await UserModel.findByPk(userId, { transaction })
  return user?.active ? user.email : null
}

const refOf = ({ id, examinedAt, teamName, patientCode }: NoticeExam): ExamRef => ({ id, examinedAt, teamName, patientCode })
const isRow = (exam: NoticeExam | ExamModel): exam is ExamModel => typeof (exam as ExamModel).save === 'function'

export function createNotifier({ mailer, log, baseUrl }: NotifierOptions): Notifier {
  const queue = async (template: string, build: () => Promise<MailMessage | null>, transaction?: Transaction) => {
    if (!mailer) return
    try {
      const message = await build()
      if (message) await mailer.enqueue(message, { transaction })
    } catch (err) {
      // The name only: a message could quote an address.
      log.error({ template, error: (err as Error)?.name }, 'e-mail not queued')
      if (transaction) throw err
    }
  }
  return {
    submitted: (exam, transaction) =>
      queue(
        'countersign-requested',
        async () => {
          const shown = isRow(exam) ? await noticeExamOf(exam, transaction) : exam
          const to = await attendingsOf(shown.teamId, shown.examinerId, transaction)
          return countersignRequested({ baseUrl, to, residentName: shown.examinerName, exam: refOf(shown) })
        },
        transaction,
      ),
    returned: (row, reviewer, transaction) =>
      queue(
        'exam-returned',
        async () => {
          const to = await emailOf(row.examinerId, transaction)
          if (!to) return null
          const exam = refOf(await noticeExamOf(row, transaction))
          return examReturned({ baseUrl, to, attendingName: reviewer.displayName, comment: row.returnComment ?? '', exam })
        },
        transaction,
      ),
    countersigned: (row, signature, transaction) =>
      queue(
        'exam-countersigned',
        async () => {
          const to = await emailOf(row.examinerId, transaction)
          if (!to) return null
          const [s, exam] = [await signatureNotice(signature, row, transaction), refOf(await noticeExamOf(row, transaction))]
          const { signerName, meaning, signedAt, timeZone } = s
          return examCountersigned({ baseUrl, timeZone, to, signerName, meaning, signedAt, exam, teaching: teachingText(s) })
        },
        transaction,
      ),
  }
}
