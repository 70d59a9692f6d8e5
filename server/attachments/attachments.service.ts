import { randomUUID } from 'node:crypto'
import { Op } from 'sequelize'
import {
  ATTACHMENTS_PER_EXAM,
  AttachmentSchema,
  AttachmentUploadFieldsSchema,
  type Attachment,
  type AttachmentMime,
} from '#shared/schemas/attachment'
import type { User } from '#shared/schemas/user'
import { audit } from '../audit.ts'
import { AppError, invalidInput } from '../errors.ts'
import { readableRow } from '../exams/exam-queries.ts'
import { isEditable } from '../exams/exam-rules.ts'
import { authoredRow, inTransaction } from '../exams/exam-writes.ts'
import { AttachmentModel, SignatureModel, type ExamModel } from '../models/index.ts'
import {
  displayNameOf,
  readStored,
  removeStored,
  sha256Of,
  sniffImageType,
  stripMetadata,
  writeStored,
  type AttachmentStore,
} from './attachment-files.ts'
import { checkPhotosAllowed } from './photo-policy.ts'

/** What multer received: the bytes in memory and the name the sender gave (display only). */
export interface Upload {
  buffer: Buffer
  originalname?: string
}

export function present(row: AttachmentModel): Attachment {
  return AttachmentSchema.parse({
    id: row.id,
    examId: row.examId,
    mimeType: row.mimeType,
    byteSize: row.byteSize,
    width: row.width,
    height: row.height,
    sha256: row.sha256,
    displayName: row.displayName,
    consentConfirmedBy: row.consentConfirmedBy,
    createdBy: row.createdBy,
    createdAt: row.createdAt.toISOString(),
  })
}

const notFound = () => new AppError('attachment-not-found', 404, 'No such photo')

/**
 * The exam, if the user may see its photos. Who may not read the exam gets 404, as from the exam API. A reader who
 * sees the exam only pseudonymised (an educator) gets 403: a photo of a neck can identify the patient.
 */
async function examShowingPhotos(user: User, examId: string): Promise<ExamModel> {
  const { row, scope } = await readableRow(user, examId)
  if (!scope.showsCode(row))
    throw new AppError('photos-hidden', 403, 'Photos are shown only to the clinicians of this exam; for your role it is pseudonymised')
  return row
}

function checkEditable(exam: ExamModel): void {
  if (!isEditable(exam.status))
    throw new AppError('attachments-locked', 409, `This exam is ${exam.status}: its photos can no longer be added or removed`)
}

const live = (examId: string) => ({ examId, deletedAt: null })

/** The author's exam, editable and with room for one more photo; checked before reading the file and again when storing it. */
async function checkCanAttach(author: User, examId: string, attachmentId: string | undefined): Promise<AttachmentModel | null> {
  return inTransaction(async (transaction) => {
    const exam = await authoredRow(author, examId, transaction)
    const existing = attachmentId ? await AttachmentModel.findByPk(attachmentId, { transaction }) : null
    if (existing) {
      if (existing.examId === examId && existing.createdBy === author.id && !existing.deletedAt) return existing
      throw new AppError('id-taken', 409, 'Another photo already has this id')
    }
    checkEditable(exam)
    const count = await AttachmentModel.count({ where: live(examId), transaction })
    if (count >= ATTACHMENTS_PER_EXAM)
      throw new AppError('attachment-limit', 409, `An exam holds at most ${ATTACHMENTS_PER_EXAM} photos; remove one before adding another`)
    return null
  })
}

async function cleanPhoto(upload: Upload | undefined): Promise<{ bytes: Buffer; mime: AttachmentMime; width: number; height: number }> {
  if (!upload?.buffer.length) throw invalidInput({ file: 'Choose a photo to attach' })
  const mime = await sniffImageType(upload.buffer)
  const clean = await stripMetadata(upload.buffer, mime)
  return { ...clean, mime }
}

/**
 * Stores a photo on the author's editable exam after the consent was confirmed: the type is read from the bytes, the
 * metadata stripped, the file named at random. A retry with the same client id answers the photo already stored.
 */
export async function addAttachment(
  store: AttachmentStore,
  author: User,
  examId: string,
  fields: unknown,
  upload: Upload | undefined,
): Promise<{ attachment: Attachment; created: boolean }> {
  await checkPhotosAllowed()
  const input = AttachmentUploadFieldsSchema.parse(fields ?? {})
  const duplicate = await checkCanAttach(author, examId, input.id)
  if (duplicate) return { attachment: present(duplicate), created: false }
  const photo = await cleanPhoto(upload)
  const storedName = await writeStored(store, photo.bytes, photo.mime)
  try {
    const row = await inTransaction(async (transaction) => {
      // Checked again under the write lock: the exam may have been submitted, or filled, while the photo was encoded.
      const exam = await authoredRow(author, examId, transaction)
      checkEditable(exam)
      if ((await AttachmentModel.count({ where: live(examId), transaction })) >= ATTACHMENTS_PER_EXAM)
        throw new AppError('attachment-limit', 409, `An exam holds at most ${ATTACHMENTS_PER_EXAM} photos; remove one before adding another`)
      const created = await AttachmentModel.create(
        {
          id: input.id ?? randomUUID(),
          examId,
          storedName,
          displayName: displayNameOf(upload?.originalname, photo.mime),
          mimeType: photo.mime,
          byteSize: photo.bytes.length,
          width: photo.width,
          height: photo.height,
          sha256: sha256Of(photo.bytes),
          consentConfirmedBy: author.id,
          createdBy: author.id,
          createdAt: new Date(),
          deletedAt: null,
        },
        { transaction },
      )
      const changes = { attachmentId: created.id, mimeType: created.mimeType, byteSize: created.byteSize, sha256: created.sha256, consentConfirmed: true }
      await audit({ actorId: author.id, action: 'attachment-add', entityType: 'exam', entityId: examId, changes }, { transaction })
      return created
    })
    return { attachment: present(row), created: true }
  } catch (e) {
    await removeStored(store, storedName)
    throw e
  }
}

export async function listAttachments(user: User, examId: string): Promise<Attachment[]> {
  await examShowingPhotos(user, examId)
  const rows = await AttachmentModel.findAll({ where: live(examId), order: [['createdAt', 'ASC'], ['id', 'ASC']] })
  return rows.map(present)
}

/** A photo's record and bytes, for a user who may see the exam's photos. */
export async function readAttachment(store: AttachmentStore, user: User, id: string): Promise<{ attachment: Attachment; bytes: Buffer }> {
  const row = await AttachmentModel.findOne({ where: { id, deletedAt: null } })
  if (!row) throw notFound()
  await examShowingPhotos(user, row.examId).catch((e: unknown) => {
    // The photo of an exam the user cannot read does not exist for them.
    throw e instanceof AppError && e.status === 404 ? notFound() : e
  })
  return { attachment: present(row), bytes: await readStored(store, row.storedName) }
}

/**
 * Removes a photo from the author's editable exam: the row stays (who, when, which hash) and the file goes. A photo
 * that was on the exam when it was countersigned stays, even after the exam is amended.
 */
export async function deleteAttachment(store: AttachmentStore, author: User, id: string): Promise<void> {
  const storedName = await inTransaction(async (transaction) => {
    const row = await AttachmentModel.findOne({ where: { id, deletedAt: null }, transaction })
    if (!row) throw notFound()
    const exam = await authoredRow(author, row.examId, transaction).catch((e: unknown) => {
      throw e instanceof AppError && e.status === 404 ? notFound() : e
    })
    checkEditable(exam)
    const signedOver = await SignatureModel.count({ where: { examId: exam.id, signedAt: { [Op.gte]: row.createdAt } }, transaction })
    if (signedOver)
      throw new AppError('attachments-locked', 409, 'This photo was part of the exam when it was countersigned and cannot be removed')
    row.deletedAt = new Date()
    await row.save({ transaction })
    const changes = { attachmentId: row.id, sha256: row.sha256 }
    await audit({ actorId: author.id, action: 'attachment-delete', entityType: 'exam', entityId: exam.id, changes }, { transaction })
    return row.storedName
  })
  await removeStored(store, storedName)
}
