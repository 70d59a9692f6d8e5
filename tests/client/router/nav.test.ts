import { beforeEach, describe, expect, it } from 'vitest'
import { defineComponent, h } from 'vue'
import { mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import { VApp } from 'vuetify/components'
import TheNavDrawer from '@/components/TheNavDrawer.vue'
import { navItemsFor } from '@/router/nav'
import { routes } from '@/router/routes'
import { useSessionStore } from '@/stores/session'
import { makeUser } from '../factories/user'
import type { Role } from '#shared/schemas/user'

function mountDrawerFor(roles: Role[]) {
  const session = useSessionStore()
  session.user = makeUser({ roles })
  const router = createRouter({ history: createMemoryHistory(), routes })
  const Host = defineComponent({ render: () => h(VApp, () => h(TheNavDrawer, { modelValue: true })) })
  return mount(Host, { global: { plugins: [createVuetify(), router] } })
}

describe('navigation by role', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
  })

  it('a resident sees home and teams but not accounts', () => {
    const names = navItemsFor(['resident']).map((item) => item.routeName)

    expect(names).toEqual(['home', 'teams'])
  })

  it('an admin sees accounts but not teams', () => {
    const names = navItemsFor(['admin']).map((item) => item.routeName)

    expect(names).toEqual(['home', 'accounts'])
  })

  it('every nav item points at a named route whose roles match', () => {
    for (const item of navItemsFor(['resident', 'attending', 'educator', 'admin'])) {
      const route = routes.find((r) => r.name === item.routeName)

      expect(route, item.routeName).toBeDefined()
      expect(route?.meta?.roles).toEqual(item.roles)
    }
  })

  it('the drawer renders only the resident\'s items', () => {
    const wrapper = mountDrawerFor(['resident'])

    expect(wrapper.find('[data-testid="nav-home"]').exists()).toBe(true)
    expect(wrapper.find('[data-testid="nav-teams"]').exists()).toBe(true)
    expect(wrapper.find('[data-testid="nav-accounts"]').exists()).toBe(false)
  })

  it('the drawer renders accounts for an admin', () => {
    const wrapper = mountDrawerFor(['admin'])

    expect(wrapper.find('[data-testid="nav-accounts"]').exists()).toBe(true)
    expect(wrapper.find('[data-testid="nav-teams"]').exists()).toBe(false)
  })
})
