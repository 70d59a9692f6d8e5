import { beforeEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import { useReferencesStore } from '@/stores/references'
import * as api from '@/api/references'
import { makeReference } from '../factories/loop'
import { httpError } from '../factories/http-error'

vi.mock('@/api/references')

describe('references store', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.resetAllMocks()
  })

  it("a stored reference joins the exam's list", async () => {
    vi.mocked(api.fetchReferences).mockResolvedValue([makeReference({ id: 'r-1' })])
    vi.mocked(api.addReference).mockResolvedValue(makeReference({ id: 'r-2', kind: 'echo-ra', value: 8 }))
    const store = useReferencesStore()
    await store.load('exam-1')

    await store.add('exam-1', { kind: 'echo-ra', value: 8, unit: 'mmHg', measuredAt: '2026-03-14T09:40:00.000Z' })

    expect(api.addReference).toHaveBeenCalledWith('exam-1', { kind: 'echo-ra', value: 8, unit: 'mmHg', measuredAt: '2026-03-14T09:40:00.000Z' })
    expect(store.references.map((r) => r.id)).toEqual(['r-1', 'r-2'])
  })

  it('a refused reference leaves the list as it was and rejects with the error', async () => {
    vi.mocked(api.fetchReferences).mockResolvedValue([makeReference({ id: 'r-1' })])
    vi.mocked(api.addReference).mockRejectedValue(httpError(400, 'invalid-input', 'Check', { value: 'An echocardiographic estimate is 3, 8 or 15 mmHg' }))
    const store = useReferencesStore()
    await store.load('exam-1')

    await expect(store.add('exam-1', { kind: 'echo-ra', value: 8, unit: 'mmHg', measuredAt: '2026-03-14T09:40:00.000Z' })).rejects.toThrow()

    expect(store.references.map((r) => r.id)).toEqual(['r-1'])
  })

  it("opening another exam drops the previous exam's references at once", async () => {
    vi.mocked(api.fetchReferences).mockResolvedValueOnce([makeReference({ id: 'r-1' })]).mockReturnValueOnce(new Promise(() => {}))
    const store = useReferencesStore()
    await store.load('exam-1')

    void store.load('exam-2')

    expect(store.references).toEqual([])
  })
})
