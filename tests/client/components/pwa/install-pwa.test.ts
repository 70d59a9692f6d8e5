import { afterEach, describe, expect, it, vi } from 'vitest'
import { createApp, defineComponent } from 'vue'
import { createMemoryHistory, createRouter } from 'vue-router'
import { flushPromises } from '@vue/test-utils'
import { installPwa } from '@/plugins/pwa'

const Page = defineComponent({ render: () => null })

function appWithRouter() {
  const router = createRouter({
    history: createMemoryHistory(),
    routes: [
      { path: '/sign-in', component: Page, meta: { public: true } },
      { path: '/', component: Page },
      { path: '/exams', component: Page },
    ],
  })
  // not app.use(router): that would start an initial navigation to '/'
  installPwa(createApp(Page), router)
  return router
}

describe('the PWA plugin asks for persistent storage', () => {
  afterEach(() => {
    Reflect.deleteProperty(navigator, 'storage')
  })

  it('once, when the first signed-in page opens, not on the sign-in page', async () => {
    const persist = vi.fn(async () => true)
    Object.defineProperty(navigator, 'storage', { value: { persisted: async () => false, persist }, configurable: true })
    const router = appWithRouter()

    await router.push('/sign-in')
    await flushPromises()
    expect(persist).not.toHaveBeenCalled()

    await router.push('/')
    await router.push('/exams')
    await flushPromises()

    expect(persist).toHaveBeenCalledOnce()
  })
})
