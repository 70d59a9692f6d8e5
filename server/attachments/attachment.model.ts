import { AttachmentModel } from '../models/index.ts'

/** Kept for callers outside server/ that still import it; the model itself is defined and bound in server/models. */
export const attachments = (): typeof AttachmentModel => AttachmentModel
