import { db } from './index'

/** Deletes everything the app keeps on this device, so no patient code stays on a shared phone (ASVS 8.2.3). */
export async function wipeLocalData(): Promise<void> {
  await db.transaction('rw', db.drafts, db.exams, db.outbox, db.meta, async () => {
    await Promise.all([db.drafts.clear(), db.exams.clear(), db.outbox.clear(), db.meta.clear()])
  })
}
