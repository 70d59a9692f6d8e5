import { beforeEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import { db } from '@/db/index'
import { useSessionStore } from '@/stores/session'
import { useTimelineStore } from '@/stores/timeline'
import * as loop from '@/api/loop'
import { makeExam } from '../components/exam/make-exam'
import { makeReference } from '../factories/loop'
import { httpError } from '../factories/http-error'
import { makeUser } from '../factories/user'

vi.mock('@/api/loop')

const timelineOf = (code: string, exams = [makeExam({ patientCode: code })]) => ({ patientCode: code, exams, references: [makeReference()], caution: CAUTION_TEXT })

describe('timeline store', () => {
  beforeEach(async () => {
    setActivePinia(createPinia())
    vi.resetAllMocks()
    useSessionStore().user = makeUser({ id: 'u-1' })
    await db.exams.clear()
  })

  it("loads the patient's exams and references from the server", async () => {
    vi.mocked(loop.fetchPatientTimeline).mockResolvedValue(timelineOf('SM-0142'))
    const store = useTimelineStore()

    await store.load('SM-0142')

    expect(loop.fetchPatientTimeline).toHaveBeenCalledWith('SM-0142')
    expect(store.timeline?.references).toHaveLength(1)
    expect(store.fromDevice).toBe(false)
  })

  it("with no network, shows this user's device copies of that code, oldest first, and no references", async () => {
    const later = makeExam({ patientCode: 'SM-0142', examinedAt: '2026-03-15T09:00:00.000Z' })
    const earlier = makeExam({ patientCode: 'SM-0142', examinedAt: '2026-03-14T09:00:00.000Z' })
    const otherPatient = makeExam({ patientCode: 'SM-0999' })
    const otherUser = makeExam({ patientCode: 'SM-0142' })
    await db.exams.bulkPut([
      { ...later, ownerId: 'u-1' },
      { ...earlier, ownerId: 'u-1' },
      { ...otherPatient, ownerId: 'u-1' },
      { ...otherUser, ownerId: 'u-2' },
    ])
    vi.mocked(loop.fetchPatientTimeline).mockRejectedValue(new TypeError('Failed to fetch'))
    const store = useTimelineStore()

    await store.load('SM-0142')

    expect(store.fromDevice).toBe(true)
    expect(store.timeline?.exams.map((e) => e.id)).toEqual([earlier.id, later.id])
    expect(store.timeline?.references).toEqual([])
    expect(store.timeline?.caution).toBe(CAUTION_TEXT)
  })

  it("a refusal from the server is shown, not replaced by the device's copies", async () => {
    await db.exams.put({ ...makeExam({ patientCode: 'SM-0142' }), ownerId: 'u-1' })
    vi.mocked(loop.fetchPatientTimeline).mockRejectedValue(httpError(403, 'codes-masked'))
    const store = useTimelineStore()

    await expect(store.load('SM-0142')).rejects.toThrow()

    expect(store.timeline).toBeNull()
  })

  it('an older answer never replaces the newer patient on screen', async () => {
    let answerFirst!: (value: ReturnType<typeof timelineOf>) => void
    vi.mocked(loop.fetchPatientTimeline)
      .mockReturnValueOnce(new Promise((resolve) => (answerFirst = resolve)))
      .mockResolvedValueOnce(timelineOf('SM-0200'))
    const store = useTimelineStore()

    const first = store.load('SM-0100')
    await store.load('SM-0200')
    answerFirst(timelineOf('SM-0100'))
    await first

    expect(store.timeline?.patientCode).toBe('SM-0200')
  })
})
