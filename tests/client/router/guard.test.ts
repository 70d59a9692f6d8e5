import { beforeEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { HTTPError } from 'ky'
import type { NormalizedOptions } from 'ky'
import { accessGuard } from '@/router/guard'
import { routes } from '@/router/routes'
import * as auth from '@/api/auth'
import { makeUser } from '../factories/user'

vi.mock('@/api/auth', () => ({
  login: vi.fn(),
  refresh: vi.fn(),
  logout: vi.fn(),
  fetchMe: vi.fn(),
  fetchHealth: vi.fn(),
}))

function unauthorized() {
  return new HTTPError(new Response(null, { status: 401 }), new Request('http://localhost/api/auth/refresh'), {} as NormalizedOptions)
}

function makeRouter() {
  const router = createRouter({ history: createMemoryHistory(), routes })
  router.beforeEach(accessGuard)
  return router
}

describe('route access guard', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.mocked(auth.fetchHealth).mockResolvedValue({ status: 'ok', demo: false })
    vi.mocked(auth.refresh).mockReset()
  })

  it('when nobody is signed in, sends to sign-in with the requested path as redirect', async () => {
    vi.mocked(auth.refresh).mockRejectedValue(unauthorized())
    const router = makeRouter()

    await router.push('/teams')

    expect(router.currentRoute.value.name).toBe('sign-in')
    expect(router.currentRoute.value.query.redirect).toBe('/teams')
  })

  it('when the browser holds no session at all (refresh resolves to none), sends to sign-in', async () => {
    vi.mocked(auth.refresh).mockResolvedValue(null)
    const router = makeRouter()

    await router.push('/teams')

    expect(router.currentRoute.value.name).toBe('sign-in')
  })

  it('when a resident opens accounts, sends to not-allowed', async () => {
    vi.mocked(auth.refresh).mockResolvedValue({ token: 't', user: makeUser({ roles: ['resident'] }) })
    const router = makeRouter()

    await router.push('/admin/accounts')

    expect(router.currentRoute.value.name).toBe('not-allowed')
  })

  it('restores the session only once across navigations', async () => {
    vi.mocked(auth.refresh).mockResolvedValue({ token: 't', user: makeUser({ roles: ['admin'] }) })
    const router = makeRouter()

    await router.push('/admin/accounts')
    await router.push('/')

    expect(router.currentRoute.value.name).toBe('home')
    expect(auth.refresh).toHaveBeenCalledTimes(1)
  })
})
