import { z } from 'zod'
import { AttachmentListSchema, AttachmentSchema } from '#shared/schemas/attachment'
import { api } from './client'
import { asAccount } from './token'

// A 5 MB photo over a weak ward signal needs longer than the API's default 10 s.
const UPLOAD_TIMEOUT_MS = 120_000


export interface PhotoUpload {
  /** The client's id for the photo, so a retried upload stores one photo. */
  id: string
  blob: Blob
  name: string
}

export async function uploadAttachment(examId: string, photo: PhotoUpload, token?: string) {
  const form = new FormData()
  form.append('consent', 'true')
  form.append('id', photo.id)
  form.append('file', photo.blob, photo.name)
  return api
    .post(`exams/${encodeURIComponent(examId)}/attachments`, { body: form, timeout: UPLOAD_TIMEOUT_MS, ...asAccount(token) })
    .json()
    .then((body) => AttachmentSchema.parse(body))
}

export async function fetchAttachments(examId: string) {
  return api
    .get(`exams/${encodeURIComponent(examId)}/attachments`)
    .json()
    .then((body) => AttachmentListSchema.parse(body).attachments)
}

/** The photo's bytes, fetched with the bearer token (an `<img src>` could not send it). */
export async function fetchAttachmentBlob(id: string): Promise<Blob> {
  return api.get(`attachments/${encodeURIComponent(id)}`, { timeout: UPLOAD_TIMEOUT_MS }).blob()
}

export async function deleteAttachment(id: string): Promise<void> {
  await api.delete(`attachments/${encodeURIComponent(id)}`)
}

const PhotoSettingSchema = z.looseObject({ values: z.looseObject({ photosAllowed: z.boolean() }) })

/** Whether the hospital allows photos (the admin's setting, `GET /api/settings`). */
export async function fetchPhotosAllowed(): Promise<boolean> {
  return api
    .get('settings')
    .json()
    .then((body) => PhotoSettingSchema.parse(body).values.photosAllowed)
}
