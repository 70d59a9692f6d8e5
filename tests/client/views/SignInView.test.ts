import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import { HTTPError } from 'ky'
import type { NormalizedOptions } from 'ky'
import SignInView from '@/views/SignInView.vue'
import { routes } from '@/router/routes'
import * as auth from '@/api/auth'

vi.mock('@/api/auth', () => ({
  login: vi.fn(),
  refresh: vi.fn(),
  logout: vi.fn(),
  fetchMe: vi.fn(),
  fetchHealth: vi.fn(),
}))

function httpError(status: number, body: unknown) {
  const response = new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } })
  const request = new Request('http://localhost/api/auth/login', { method: 'POST' })
  return new HTTPError(response, request, {} as NormalizedOptions)
}

async function mountSignIn() {
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push({ name: 'sign-in' })
  return mount(SignInView, { global: { plugins: [createVuetify(), router] } })
}

async function fillAndSubmit(wrapper: Awaited<ReturnType<typeof mountSignIn>>, email: string, password: string) {
  await wrapper.find('[data-testid="sign-in-email"] input').setValue(email)
  await wrapper.find('[data-testid="sign-in-password"] input').setValue(password)
  await wrapper.find('form').trigger('submit')
  await flushPromises()
}

describe('SignInView', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.mocked(auth.login).mockReset()
  })

  it('when the e-mail is malformed, shows a field error and does not call the API', async () => {
    const wrapper = await mountSignIn()

    await fillAndSubmit(wrapper, 'not-an-email', 'secret')

    expect(wrapper.find('[data-testid="sign-in-email"]').text()).toContain('Enter a valid e-mail address')
    expect(auth.login).not.toHaveBeenCalled()
  })

  it('when the API answers 401, shows the credentials message and keeps the typed e-mail', async () => {
    vi.mocked(auth.login).mockRejectedValue(
      httpError(401, { error: { code: 'invalid-credentials', message: 'Wrong e-mail or password' } }),
    )
    const wrapper = await mountSignIn()

    await fillAndSubmit(wrapper, 'rowan.reed@saltmarsh.example', 'wrong-password')

    expect(auth.login).toHaveBeenCalledWith({ email: 'rowan.reed@saltmarsh.example', password: 'wrong-password' })
    expect(wrapper.find('[data-testid="sign-in-alert"]').text()).toContain('e-mail address or password is not correct')
    expect(wrapper.find<HTMLInputElement>('[data-testid="sign-in-email"] input').element.value).toBe('rowan.reed@saltmarsh.example')
  })

  it('when the API returns field errors, shows them under the fields', async () => {
    vi.mocked(auth.login).mockRejectedValue(
      httpError(400, { error: { code: 'invalid-input', message: 'Invalid input', fields: { password: 'Password too long' } } }),
    )
    const wrapper = await mountSignIn()

    await fillAndSubmit(wrapper, 'rowan.reed@saltmarsh.example', 'x')

    expect(wrapper.find('[data-testid="sign-in-password"]').text()).toContain('Password too long')
    expect(wrapper.find('[data-testid="sign-in-alert"]').exists()).toBe(false)
  })

  it('when the server cannot be reached, shows a network message', async () => {
    vi.mocked(auth.login).mockRejectedValue(new TypeError('Failed to fetch'))
    const wrapper = await mountSignIn()

    await fillAndSubmit(wrapper, 'rowan.reed@saltmarsh.example', 'secret')

    expect(wrapper.find('[data-testid="sign-in-alert"]').text()).toContain('Cannot reach the server')
  })
})
