import { beforeEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import { saveDraft } from '@/db/drafts'
import * as api from '@/api/attachments'
import { useAttachmentsStore } from '@/stores/attachments'
import { useSessionStore } from '@/stores/session'
import { makeDraft } from '../factories/draft'
import { AUTHOR, clearDevice, save } from '../db/outbox-factory'

vi.mock('@/api/attachments')

describe('useAttachmentsStore: which photos it asks the server for', () => {
  beforeEach(async () => {
    setActivePinia(createPinia())
    useSessionStore().user = AUTHOR
    vi.mocked(api.fetchAttachments).mockReset().mockResolvedValue([])
    vi.mocked(api.fetchPhotosAllowed).mockResolvedValue(true)
    await clearDevice()
  })

  it('when the exam is a bedside draft never saved, does not ask the server for its photos', async () => {
    const draft = makeDraft()
    await saveDraft(draft)
    const store = useAttachmentsStore()

    await store.open(draft.id, true)

    expect(api.fetchAttachments).not.toHaveBeenCalled()
    expect(store.stored).toEqual([])
    store.close()
  })

  it('when the exam was saved on this device but its first save has not reached the server, does not ask for its photos', async () => {
    const input = await save()
    const store = useAttachmentsStore()

    await store.open(input.id, false)

    expect(api.fetchAttachments).not.toHaveBeenCalled()
    store.close()
  })

  it("when the exam is not a draft on this device (e.g. another examiner's), asks the server for its photos", async () => {
    const store = useAttachmentsStore()

    await store.open('exam-on-server', false)

    expect(api.fetchAttachments).toHaveBeenCalledWith('exam-on-server')
    store.close()
  })
})
