import { db } from './index'

/**
 * Where service workers of earlier app versions kept pushes waiting for Background Sync; nothing replays them now, but
 * they hold patient data, so sign-out still deletes them.
 */
export const BACKGROUND_SYNC_DB = 'workbox-background-sync'

function deleteDatabase(name: string): Promise<void> {
  return new Promise((resolve, reject) => {
    const request = indexedDB.deleteDatabase(name)
    request.onsuccess = () => resolve()
    request.onerror = () => reject(request.error)
    // Another tab still holds it open; the deletion completes once that tab lets go.
    request.onblocked = () => resolve()
  })
}

/** Deletes everything the app keeps on this device, so no patient code stays on a shared phone (ASVS 8.2.3). */
export async function wipeLocalData(): Promise<void> {
  await db.transaction('rw', [db.drafts, db.exams, db.outbox, db.meta, db.attachments], async () => {
    await Promise.all([db.drafts.clear(), db.exams.clear(), db.outbox.clear(), db.meta.clear(), db.attachments.clear()])
  })
  await deleteDatabase(BACKGROUND_SYNC_DB)
}
