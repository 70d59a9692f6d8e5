import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import PasswordResetView from '@/views/PasswordResetView.vue'
import { routes } from '@/router/routes'
import * as accounts from '@/api/accounts'
import { PASSWORD_RESET_ACCEPTED } from '#shared/schemas/account'

vi.mock('@/api/accounts')

async function mountReset(query = {}) {
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push({ name: 'password-reset', query })
  const wrapper = mount(PasswordResetView, { global: { plugins: [createVuetify(), router] } })
  await flushPromises()
  return wrapper
}

describe('PasswordResetView', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.mocked(accounts.requestPasswordReset).mockReset().mockResolvedValue({ ...PASSWORD_RESET_ACCEPTED })
  })

  afterEach(() => {
    document.body.innerHTML = ''
  })

  it('sends the address and shows the neutral confirmation', async () => {
    const wrapper = await mountReset({ email: 'Mei@saltmarsh.test' })

    await wrapper.find('form').trigger('submit')
    await flushPromises()

    expect(accounts.requestPasswordReset).toHaveBeenCalledWith('mei@saltmarsh.test')
    expect(wrapper.find('[data-testid="password-reset-confirmation"]').text()).toBe(PASSWORD_RESET_ACCEPTED.message)
  })

  it('a malformed address gets a field error and no request', async () => {
    const wrapper = await mountReset()

    await wrapper.find('[data-testid="password-reset-email"] input').setValue('not-an-address')
    await wrapper.find('form').trigger('submit')
    await flushPromises()

    expect(wrapper.find('[data-testid="password-reset-email"]').text()).toContain('Enter a valid e-mail address')
    expect(accounts.requestPasswordReset).not.toHaveBeenCalled()
  })
})
