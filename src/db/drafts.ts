import { db } from './index'
import { DraftRowSchema, type DraftRow, type DraftState } from './draft-schema'

function parseRow(row: unknown): DraftRow | undefined {
  const parsed = DraftRowSchema.safeParse(row)
  return parsed.success ? parsed.data : undefined
}

/** Writes a draft; a JSON copy, because IndexedDB cannot clone Vue proxies. */
export async function saveDraft(row: DraftRow): Promise<void> {
  await db.drafts.put(JSON.parse(JSON.stringify(row)) as DraftRow)
}

export async function loadDraft(id: string): Promise<DraftRow | undefined> {
  return parseRow(await db.drafts.get(id))
}

/** Drafts newest first, optionally only those in one state; unreadable rows are skipped. */
export async function listDrafts(state?: DraftState): Promise<DraftRow[]> {
  const rows = await db.drafts.orderBy('updatedAt').reverse().toArray()
  return rows
    .map(parseRow)
    .filter((row): row is DraftRow => row !== undefined)
    .filter((row) => state === undefined || row.state === state)
}

export async function deleteDraft(id: string): Promise<void> {
  await db.drafts.delete(id)
}
