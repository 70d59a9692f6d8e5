import { RosterApplyResultSchema, RosterPreviewSchema } from '#shared/schemas/roster'
import { api } from './client'

// Applying a full roster writes up to a few thousand rows in one transaction: allow more than the default 10 s.
const TIMEOUT_MS = 60_000

function form(file: File): FormData {
  const body = new FormData()
  body.append('file', file, file.name)
  return body
}

/** What importing the file would do, row by row; the server reads the file and writes nothing. */
export function previewRoster(file: File) {
  return api.post('admin/roster/preview', { body: form(file), timeout: TIMEOUT_MS }).json().then((b) => RosterPreviewSchema.parse(b))
}

/** Imports the file: the server reads it again (it never trusts a preview) and skips the invalid rows. */
export function applyRoster(file: File) {
  return api.post('admin/roster/apply', { body: form(file), timeout: TIMEOUT_MS }).json().then((b) => RosterApplyResultSchema.parse(b))
}
