/** What to tell the user when IndexedDB refuses a write: no space left, storage not allowed, or a lost connection. */
export function storageProblem(e: unknown): string {
  const error = e as { name?: string; inner?: { name?: string }; message?: string } | null
  const names = [error?.name, error?.inner?.name]
  if (names.includes('QuotaExceededError')) return 'Not queued for the server: this device has no storage space left for the app.'
  if (names.includes('InvalidStateError')) return 'Not queued for the server: this browser does not allow the app to store data here (a private window?).'
  if (names.includes('DatabaseClosedError') || /connection.*lost/i.test(error?.message ?? ''))
    return 'Not queued for the server: the connection to this device’s storage was lost. Reload the app and save again.'
  return 'Not queued for the server: this device’s storage refused the write.'
}
