import { beforeEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import { HTTPError, type NormalizedOptions } from 'ky'
import { useSessionStore } from '@/stores/session'
import * as auth from '@/api/auth'

vi.mock('@/api/auth', () => ({ login: vi.fn(), refresh: vi.fn(), logout: vi.fn(), fetchMe: vi.fn(), fetchHealth: vi.fn() }))

const unauthorized = () =>
  new HTTPError(new Response('{}', { status: 401 }), new Request('http://localhost/api/auth/refresh'), {} as NormalizedOptions)

/** One app start: a new store restoring its session against the mocked server. */
async function start() {
  setActivePinia(createPinia())
  const session = useSessionStore()
  await session.restore()
  return session
}

describe('session store: the demo flag', () => {
  beforeEach(() => {
    localStorage.clear()
    vi.mocked(auth.refresh).mockReset().mockRejectedValue(unauthorized())
    vi.mocked(auth.fetchHealth).mockReset()
  })

  it('on an offline start, keeps the demo ribbon the server last asked for', async () => {
    vi.mocked(auth.fetchHealth).mockResolvedValueOnce({ status: 'ok', demo: true })
    expect((await start()).demo).toBe(true)

    vi.mocked(auth.fetchHealth).mockRejectedValueOnce(new TypeError('Failed to fetch'))

    expect((await start()).demo).toBe(true)
  })

  it('shows no ribbon offline when the server last said it runs on real data, or never answered', async () => {
    vi.mocked(auth.fetchHealth).mockRejectedValueOnce(new TypeError('Failed to fetch'))
    expect((await start()).demo).toBe(false)

    vi.mocked(auth.fetchHealth).mockResolvedValueOnce({ status: 'ok', demo: false })
    await start()
    vi.mocked(auth.fetchHealth).mockRejectedValueOnce(new TypeError('Failed to fetch'))

    expect((await start()).demo).toBe(false)
  })
})
