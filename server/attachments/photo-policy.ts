import { AppError } from '../errors.ts'
import { currentSettings } from '../settings/settings.service.ts'

/** Whether the deployment allows photos: the admin's setting (off by default, see DEFAULT_APP_SETTINGS). */
export async function photosAllowed(): Promise<boolean> {
  return (await currentSettings()).values.photosAllowed
}

export async function checkPhotosAllowed(): Promise<void> {
  if (!(await photosAllowed()))
    throw new AppError('photos-disabled', 403, 'Photo attachments are switched off for this hospital; an admin can allow them in the settings')
}
