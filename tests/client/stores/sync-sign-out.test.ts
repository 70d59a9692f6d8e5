import '../attachments/node-file-apis'
import { beforeEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import { HTTPError, type NormalizedOptions } from 'ky'
import { db } from '@/db'
import { saveDraft } from '@/db/drafts'
import { loadProfile, saveProfile } from '@/db/meta'
import { useSessionStore } from '@/stores/session'
import * as auth from '@/api/auth'
import { makeExam } from '../components/exam/make-exam'
import { makeDraft } from '../factories/draft'
import { makeUser } from '../factories/user'
import { clearDevice, save } from '../db/outbox-factory'

vi.mock('@/api/auth', () => ({ login: vi.fn(), refresh: vi.fn(), logout: vi.fn(), fetchMe: vi.fn(), fetchHealth: vi.fn() }))

const unauthorized = () =>
  new HTTPError(new Response('{}', { status: 401 }), new Request('http://localhost/api/auth/refresh'), {} as NormalizedOptions)

const deviceCounts = async () => [await db.drafts.count(), await db.exams.count(), await db.outbox.count(), await db.meta.count()]

function signedIn() {
  const session = useSessionStore()
  Object.assign(session, { user: makeUser({ id: 'u-1' }), token: 'token' })
  return session
}

describe('signing out on a shared phone', () => {
  beforeEach(async () => {
    setActivePinia(createPinia())
    await clearDevice()
    vi.mocked(auth.logout).mockReset().mockResolvedValue(undefined)
    vi.mocked(auth.refresh).mockReset()
    vi.mocked(auth.fetchHealth).mockReset().mockResolvedValue({ status: 'ok', demo: false })
  })

  it('with changes not yet on the server, keeps everything, stays signed in and reports the work', async () => {
    await save()
    const session = signedIn()

    const blocked = await session.signOut()

    expect(blocked).toEqual({ changes: 1, drafts: 0, photos: 0 })
    expect(session.signedIn).toBe(true)
    expect(await db.outbox.count()).toBe(1)
    expect(auth.logout).not.toHaveBeenCalled()
  })

  it('counts an unfinished exam with a patient code as work, but not an empty one', async () => {
    await saveDraft(makeDraft({ patientCode: 'SM-0142' }))
    await saveDraft(makeDraft({ patientCode: '' }))
    const session = signedIn()

    const blocked = await session.signOut()

    expect(blocked).toEqual({ changes: 0, drafts: 1, photos: 0 })
  })

  it('counts a photo still waiting on the device as work', async () => {
    await db.attachments.put({
      id: 'photo-1', examId: 'exam-1', authorId: 'u-1', blob: new Blob([new Uint8Array([0xff, 0xd8, 0xff])], { type: 'image/jpeg' }),
      mime: 'image/jpeg', name: 'neck.jpg', size: 3, consent: true, state: 'pending', attempts: 0, lastError: null,
      createdAt: '2026-12-02T09:00:00.000Z',
    })
    const session = signedIn()

    const blocked = await session.signOut()

    expect(blocked).toEqual({ changes: 0, drafts: 0, photos: 1 })
    expect(await db.attachments.count()).toBe(1)
  })

  it('once the user accepts losing the work, signs out and wipes the device', async () => {
    await save()
    const session = signedIn()

    const blocked = await session.signOut({ discardUnsynced: true })

    expect(blocked).toBeNull()
    expect(session.signedIn).toBe(false)
    expect(await deviceCounts()).toEqual([0, 0, 0, 0])
    expect(auth.logout).toHaveBeenCalledOnce()
  })

  it('with nothing unsent, wipes the exam copies, saved drafts and profile, even when the server is out of reach', async () => {
    await db.exams.put({ ...makeExam(), ownerId: 'u-1' })
    await saveDraft(makeDraft({ patientCode: 'SM-0142' }, { state: 'saved' }))
    await saveProfile(makeUser({ id: 'u-1' }))
    vi.mocked(auth.logout).mockRejectedValue(new TypeError('Failed to fetch'))
    const session = signedIn()

    const blocked = await session.signOut()

    expect(blocked).toBeNull()
    expect(session.signedIn).toBe(false)
    expect(await deviceCounts()).toEqual([0, 0, 0, 0])
  })

  it('opening the app offline keeps the profile this device holds, without a token', async () => {
    await saveProfile(makeUser({ id: 'u-1', displayName: 'Rowan Reed' }))
    vi.mocked(auth.refresh).mockRejectedValue(new TypeError('Failed to fetch'))
    const session = useSessionStore()

    await session.restore()

    expect(session.user).toMatchObject({ id: 'u-1', displayName: 'Rowan Reed' })
    expect(session.token).toBeNull()
  })

  it('opening the app when the server says the session ended signs out rather than using the kept profile', async () => {
    await saveProfile(makeUser({ id: 'u-1' }))
    vi.mocked(auth.refresh).mockRejectedValue(unauthorized())
    const session = useSessionStore()

    await session.restore()

    expect(session.user).toBeNull()
  })

  it('opening the app when this browser holds no session (the server answers 204) signs out without a warning', async () => {
    await saveProfile(makeUser({ id: 'u-1' }))
    vi.mocked(auth.refresh).mockResolvedValue(null)
    const warn = vi.spyOn(console, 'warn')
    const session = useSessionStore()

    await session.restore()

    expect(session.user).toBeNull()
    expect(session.restored).toBe(true)
    expect(warn).not.toHaveBeenCalled()
    warn.mockRestore()
  })

  it('a restored session keeps the profile on the device, for the next offline start', async () => {
    vi.mocked(auth.refresh).mockResolvedValue({ token: 't', user: makeUser({ id: 'u-1', displayName: 'Rowan Reed' }) })
    const session = useSessionStore()

    await session.restore()

    await vi.waitFor(async () => expect(await loadProfile()).toMatchObject({ id: 'u-1', displayName: 'Rowan Reed' }))
    expect(session.token).toBe('t')
  })

  it('renewing the token when the browser no longer holds a session answers refused', async () => {
    vi.mocked(auth.refresh).mockResolvedValue(null)
    const session = signedIn()

    const outcome = await session.renew('u-1')

    expect(outcome).toBe('refused')
    expect(session.token).toBe('token')
  })
})
