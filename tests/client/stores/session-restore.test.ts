import { beforeEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import { flushPromises } from '@vue/test-utils'
import { HTTPError, type NormalizedOptions } from 'ky'
import type { Session } from '#shared/schemas/user'
import { useSessionStore } from '@/stores/session'
import * as auth from '@/api/auth'
import { makeUser } from '../factories/user'

vi.mock('@/api/auth', () => ({ login: vi.fn(), refresh: vi.fn(), logout: vi.fn(), fetchMe: vi.fn(), fetchHealth: vi.fn() }))

const unauthorized = () =>
  new HTTPError(new Response('{}', { status: 401 }), new Request('http://localhost/api/auth/refresh'), {} as NormalizedOptions)

/** A refresh call the test answers itself, when it chooses. */
function pendingRefresh() {
  let answer: (session: Session | null) => void = () => undefined
  vi.mocked(auth.refresh).mockReturnValueOnce(new Promise((resolve) => (answer = resolve)))
  return (session: Session | null) => answer(session)
}

/** One app start, with a new store. */
function start() {
  setActivePinia(createPinia())
  return useSessionStore()
}

/** Whether the promise has settled once every answer already given has been handled. */
async function settled(promise: Promise<unknown>) {
  let done = false
  void promise.then(() => (done = true))
  await flushPromises()
  return done
}

describe('session store: restoring the session at app start', () => {
  beforeEach(() => {
    localStorage.clear()
    vi.mocked(auth.refresh).mockReset().mockResolvedValue(null)
    vi.mocked(auth.fetchHealth).mockReset().mockResolvedValue({ status: 'ok', demo: false })
    vi.mocked(auth.login).mockReset()
  })

  it('on a public page in a browser that never held a session here, is ready before the refresh call answers', async () => {
    const answer = pendingRefresh()
    const session = start()

    const ready = await settled(session.restore({ publicPage: true }))

    expect(ready).toBe(true)
    expect(session.signedIn).toBe(false)
    answer({ token: 't', user: makeUser({ id: 'u-1' }) })
    await vi.waitFor(() => expect(session.user?.id).toBe('u-1'))
  })

  it('once a session was seen, waits for the refresh call even on a public page, so the app bar shows the account', async () => {
    vi.mocked(auth.refresh).mockResolvedValueOnce({ token: 't', user: makeUser({ id: 'u-1' }) })
    await start().restore()
    const answer = pendingRefresh()
    const session = start()

    const restoring = session.restore({ publicPage: true })

    expect(await settled(restoring)).toBe(false)
    answer({ token: 't2', user: makeUser({ id: 'u-1' }) })
    await restoring
    expect(session.user?.id).toBe('u-1')
  })

  it('on a page behind sign-in, always waits for the refresh call', async () => {
    const answer = pendingRefresh()
    const session = start()

    const restoring = session.restore()

    expect(await settled(restoring)).toBe(false)
    answer(null)
    await restoring
    expect(session.restored).toBe(true)
  })

  it('when the server says the session ended, public pages stop waiting for the refresh call again', async () => {
    vi.mocked(auth.refresh).mockResolvedValueOnce({ token: 't', user: makeUser() })
    await start().restore()
    vi.mocked(auth.refresh).mockRejectedValueOnce(unauthorized())
    await start().restore()
    const answer = pendingRefresh()

    const ready = await settled(start().restore({ publicPage: true }))

    expect(ready).toBe(true)
    answer(null)
  })

  it('a refresh answer that arrives after the user signed in on that page leaves the new session alone', async () => {
    const answer = pendingRefresh()
    vi.mocked(auth.login).mockResolvedValueOnce({ token: 'fresh', user: makeUser({ id: 'u-2' }) })
    const session = start()
    await session.restore({ publicPage: true })

    await session.signIn('rowan.reed@saltmarsh.example', 'correct horse')
    answer(null)
    await vi.waitFor(() => expect(session.restored).toBe(true))

    expect(session.user?.id).toBe('u-2')
    expect(session.token).toBe('fresh')
  })
})
