import { z } from 'zod'
import { uuidField } from './fields.ts'

/** The image types a photo may have, checked on the file's own bytes (never its name or the sender's MIME type). */
export const ATTACHMENT_MIME_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const
export const AttachmentMimeSchema = z.enum(ATTACHMENT_MIME_TYPES)
export type AttachmentMime = z.infer<typeof AttachmentMimeSchema>

/** Limits of issue 7: at most 4 photos per exam, each at most 5 MB (5 × 1024 × 1024 bytes). */
export const ATTACHMENT_MAX_BYTES = 5 * 1024 * 1024
export const ATTACHMENTS_PER_EXAM = 4

/** The form fields beside the file in `POST /api/exams/:id/attachments` (multipart, so every value is text). */
export const AttachmentUploadFieldsSchema = z.object({
  consent: z.literal('true', { message: 'Confirm that the patient consented to the photo' }),
  /** An id made by the client, so an upload retried after a lost answer stores one photo, not two. */
  id: uuidField('Send a UUID or leave the id out').optional(),
})

/** A stored photo of an exam's measurement set-up, as the API answers it. */
export const AttachmentSchema = z.object({
  id: z.string(),
  examId: z.string(),
  mimeType: AttachmentMimeSchema,
  byteSize: z.number().int().nonnegative(),
  width: z.number().int().nullable(),
  height: z.number().int().nullable(),
  sha256: z.string(),
  /** A cleaned-up version of the sender's file name, for display only; never used as a path. */
  displayName: z.string(),
  consentConfirmedBy: z.string(),
  createdBy: z.string(),
  createdAt: z.string(),
})
export type Attachment = z.infer<typeof AttachmentSchema>

export const AttachmentListSchema = z.object({ attachments: z.array(AttachmentSchema) })
export type AttachmentList = z.infer<typeof AttachmentListSchema>
