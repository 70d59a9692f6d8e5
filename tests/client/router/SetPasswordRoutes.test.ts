import { beforeEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { HTTPError, type NormalizedOptions } from 'ky'
import { accessGuard } from '@/router/guard'
import { routes } from '@/router/routes'
import * as auth from '@/api/auth'

vi.mock('@/api/auth', () => ({ login: vi.fn(), refresh: vi.fn(), logout: vi.fn(), fetchMe: vi.fn(), fetchHealth: vi.fn() }))

describe('the password routes are public', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.mocked(auth.fetchHealth).mockResolvedValue({ status: 'ok', demo: false })
    vi.mocked(auth.refresh).mockRejectedValue(
      new HTTPError(new Response(null, { status: 401 }), new Request('http://localhost/api/auth/refresh'), {} as NormalizedOptions),
    )
  })

  it.each([
    ['/invitation#token=abc', 'set-password'],
    ['/reset-password#token=abc', 'set-password'],
    ['/set-password#token=abc', 'set-password'],
    ['/forgot-password', 'password-reset'],
  ])('a signed-out visitor may open %s', async (path, name) => {
    const router = createRouter({ history: createMemoryHistory(), routes })
    router.beforeEach(accessGuard)

    await router.push(path)

    expect(router.currentRoute.value.name).toBe(name)
    expect(router.currentRoute.value.fullPath).toBe(path)
  })
})
