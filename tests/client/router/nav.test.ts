import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import { flushPromises, mount, type VueWrapper } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import { VApp } from 'vuetify/components'
import TheNavDrawer from '@/components/TheNavDrawer.vue'
import { navItemsFor } from '@/router/nav'
import { routes } from '@/router/routes'
import { useSessionStore } from '@/stores/session'
import * as supervision from '@/api/supervision'
import { makeUser } from '../factories/user'
import type { Role } from '#shared/schemas/user'

vi.mock('@/api/supervision')

// Drawers left mounted would keep asking for the sign-off count during later tests.
const mounted: VueWrapper[] = []

function mountDrawerFor(roles: Role[]) {
  const session = useSessionStore()
  session.user = makeUser({ roles })
  const router = createRouter({ history: createMemoryHistory(), routes })
  const Host = defineComponent({ render: () => h(VApp, () => h(TheNavDrawer, { modelValue: true })) })
  const wrapper = mount(Host, { global: { plugins: [createVuetify(), router] } })
  mounted.push(wrapper)
  return wrapper
}

describe('navigation by role', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
  })

  afterEach(() => {
    for (const wrapper of mounted.splice(0)) wrapper.unmount()
  })

  it('a resident sees home, recording, the exam log, agreement, their own agreement, rounds and teams but not accounts', () => {
    const names = navItemsFor(['resident']).map((item) => item.routeName)

    expect(names).toEqual(['home', 'record', 'exams', 'agreement', 'my-agreement', 'rounds', 'teams', 'device'])
  })

  it('an educator reads the exam log but is not offered recording', () => {
    const names = navItemsFor(['educator']).map((item) => item.routeName)

    expect(names).toEqual(['home', 'exams', 'agreement', 'rounds', 'teams', 'device'])
  })

  it('an admin sees accounts, the audit trail, the mailbox and the settings but not teams', () => {
    const names = navItemsFor(['admin']).map((item) => item.routeName)

    expect(names).toEqual(['home', 'accounts', 'audit-trail', 'mailbox', 'settings', 'device'])
  })

  it('an attending is offered the sign-off queue; a resident is not', () => {
    const attending = navItemsFor(['attending']).map((item) => item.routeName)
    const resident = navItemsFor(['resident']).map((item) => item.routeName)

    expect(attending).toContain('signoff-queue')
    expect(resident).not.toContain('signoff-queue')
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

  it('the sign-off queue item shows how many exams wait for the attending', async () => {
    vi.mocked(supervision.fetchSignoffCount).mockResolvedValue(4)

    const wrapper = mountDrawerFor(['attending'])

    await vi.waitFor(() => expect(wrapper.find('[data-testid="signoff-count"]').exists()).toBe(true))
    expect(wrapper.find('[data-testid="nav-signoff-queue"]').text()).toContain('4')
  })

  it('the drawer does not ask a resident for a sign-off count', async () => {
    vi.mocked(supervision.fetchSignoffCount).mockClear().mockResolvedValue(4)
    // Loaded beforehand, so a badge the drawer did render would mount, and ask, within the flush below.
    await import('@/components/supervision/SupervisionCountBadge.vue')

    mountDrawerFor(['resident'])
    await flushPromises()

    expect(supervision.fetchSignoffCount).not.toHaveBeenCalled()
  })
})
