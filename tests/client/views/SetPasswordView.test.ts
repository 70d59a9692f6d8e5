import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import SetPasswordView from '@/views/SetPasswordView.vue'
import { routes } from '@/router/routes'
import * as accounts from '@/api/accounts'
import { httpError } from '../factories/http-error'

vi.mock('@/api/accounts')

async function mountAt(path: string) {
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push(path)
  const wrapper = mount(SetPasswordView, { global: { plugins: [createVuetify(), router] }, attachTo: document.body })
  await flushPromises()
  return { wrapper, router }
}

async function fill(wrapper: Awaited<ReturnType<typeof mountAt>>['wrapper'], password: string, confirm = password) {
  await wrapper.find('[data-testid="set-password-password"] input').setValue(password)
  await wrapper.find('[data-testid="set-password-confirm"] input').setValue(confirm)
  await wrapper.find('form').trigger('submit')
  await flushPromises()
}

describe('SetPasswordView', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.mocked(accounts.setPasswordWithLink).mockReset()
  })

  afterEach(() => {
    document.body.innerHTML = ''
  })

  it('reads the token from the fragment, drops it from the address, explains the rules and sets the password', async () => {
    vi.mocked(accounts.setPasswordWithLink).mockResolvedValue({ email: 'mei@saltmarsh.test', purpose: 'invitation' })
    const { wrapper, router } = await mountAt('/invitation#token=abc%2Fdef')

    expect(router.currentRoute.value.hash).toBe('')
    expect(wrapper.find('h1').text()).toBe('Welcome to Plumbline')
    expect(wrapper.find('[data-testid="password-rules"]').text()).toContain('At least 12 characters')
    await fill(wrapper, 'tide tables for the old pier')

    expect(accounts.setPasswordWithLink).toHaveBeenCalledWith({ token: 'abc/def', password: 'tide tables for the old pier' })
    expect(wrapper.find('[data-testid="set-password-done"]').text()).toContain('mei@saltmarsh.test')
    expect(wrapper.find('[data-testid="set-password-sign-in"]').attributes('href')).toBe('/sign-in?email=mei@saltmarsh.test')
  })

  it('checks length and the repeat before sending', async () => {
    const { wrapper } = await mountAt('/reset-password#token=abc')

    await fill(wrapper, 'short', 'shorter')

    expect(wrapper.find('[data-testid="set-password-password"]').text()).toContain('at least 12 characters')
    expect(wrapper.find('[data-testid="set-password-confirm"]').text()).toContain('not the same')
    expect(accounts.setPasswordWithLink).not.toHaveBeenCalled()
  })

  it('shows the server’s password error under the field and keeps the form', async () => {
    vi.mocked(accounts.setPasswordWithLink).mockRejectedValue(
      httpError(400, 'invalid-input', 'Some fields need attention', { password: 'This password is on the list of very common passwords; choose another' }),
    )
    const { wrapper } = await mountAt('/reset-password#token=abc')

    await fill(wrapper, 'qwertyuiop123')

    expect(wrapper.find('[data-testid="set-password-password"]').text()).toContain('very common')
    expect(wrapper.find('[data-testid="set-password-submit"]').exists()).toBe(true)
  })

  it('an invalid or used link says so and offers a new one', async () => {
    vi.mocked(accounts.setPasswordWithLink).mockRejectedValue(
      httpError(400, 'invalid-link', 'This link does not work any more: links work once and expire. Ask for a new one.'),
    )
    const { wrapper } = await mountAt('/reset-password#token=used')

    await fill(wrapper, 'tide tables for the old pier')

    expect(wrapper.find('[data-testid="set-password-link-problem"]').text()).toContain('links work once')
    expect(wrapper.find('[data-testid="set-password-new-link"]').attributes('href')).toBe('/forgot-password')
  })

  it('without a token, explains that the e-mailed link is needed', async () => {
    const { wrapper } = await mountAt('/set-password')

    expect(wrapper.find('[data-testid="set-password-link-problem"]').text()).toContain('needs the link from your e-mail')
  })
})
