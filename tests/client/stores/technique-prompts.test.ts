import { beforeEach, describe, expect, it } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import { db } from '@/db/index'
import { useTechniquePromptsStore } from '@/stores/technique-prompts'

describe('technique prompts store', () => {
  beforeEach(async () => {
    setActivePinia(createPinia())
    await db.meta.clear()
  })

  it('a dismissed prompt stays dismissed on this device after the app restarts', async () => {
    const store = useTechniquePromptsStore()
    await store.load()
    await store.dismiss('end-expiration')

    setActivePinia(createPinia())
    const restarted = useTechniquePromptsStore()
    await restarted.load()

    expect(restarted.dismissed).toEqual(['end-expiration'])
  })

  it('showing every prompt again forgets the dismissals', async () => {
    const store = useTechniquePromptsStore()
    await store.load()
    await store.dismiss('tangential-light')

    await store.restoreAll()
    setActivePinia(createPinia())
    const restarted = useTechniquePromptsStore()
    await restarted.load()

    expect(restarted.dismissed).toEqual([])
  })

  it('a stored value it cannot read shows every prompt', async () => {
    await db.meta.put({ key: 'technique-prompts-dismissed', value: 'not a list' })
    const store = useTechniquePromptsStore()

    await store.load()

    expect(store.dismissed).toEqual([])
  })
})
