import { describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import RosterImportView from '@/views/RosterImportView.vue'
import { routes } from '@/router/routes'

vi.mock('@/api/roster')

describe('RosterImportView', () => {
  it('lives at /admin/roster, for admins only', () => {
    const route = routes.find((r) => r.name === 'roster-import')!

    expect(route.path).toBe('/admin/roster')
    expect(route.meta?.roles).toEqual(['admin'])
    expect(typeof route.component).toBe('function')
  })

  it('shows the import panel, the file format and the way back to accounts', async () => {
    const router = createRouter({ history: createMemoryHistory(), routes })
    await router.push({ name: 'roster-import' })

    const wrapper = mount(RosterImportView, { global: { plugins: [createVuetify(), router] } })
    await flushPromises()

    expect(wrapper.find('h1').text()).toBe('Roster import')
    expect(wrapper.find('[data-testid="roster-import"]').exists()).toBe(true)
    expect(wrapper.find('[data-testid="roster-format-help"]').text()).toContain('What the file must look like')
    expect(wrapper.find('a[href="/admin/accounts"]').exists()).toBe(true)
  })
})
