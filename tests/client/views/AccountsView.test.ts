import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import AccountsView from '@/views/AccountsView.vue'
import { routes } from '@/router/routes'
import * as accounts from '@/api/accounts'
import * as teams from '@/api/teams'
import { useSessionStore } from '@/stores/session'
import { makeAccount } from '../factories/account'
import { httpError } from '../factories/http-error'
import { makeUser } from '../factories/user'

vi.mock('@/api/accounts')
vi.mock('@/api/teams')

const mei = makeAccount()
const noah = makeAccount({ id: 'acc-2', displayName: 'Dr Noah Fitzgerald', email: 'noah@saltmarsh.test', status: 'invited', invitedAt: '2026-12-06T10:00:00.000Z' })
const self = makeAccount({ id: 'me', displayName: 'Morgan Reyes', email: 'admin@saltmarsh.test', roles: ['admin'], teams: [] })

async function mountAccounts() {
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push({ name: 'accounts' })
  useSessionStore().user = makeUser({ id: 'me', roles: ['admin'] })
  const wrapper = mount(AccountsView, { global: { plugins: [createVuetify(), router] }, attachTo: document.body })
  await flushPromises()
  return wrapper
}

const byTestId = (id: string) => document.querySelector<HTMLElement>(`[data-testid="${id}"]`)

async function type(id: string, value: string) {
  const input = byTestId(id)!.querySelector('input')!
  input.value = value
  input.dispatchEvent(new Event('input'))
  await flushPromises()
}

describe('AccountsView', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.mocked(accounts.fetchAccounts).mockReset().mockResolvedValue({ accounts: [self, mei, noah], total: 3, page: 1, pageSize: 25 })
    vi.mocked(teams.fetchTeams).mockResolvedValue([{ id: 'icu', name: 'Medical ICU', members: [] }])
  })

  afterEach(() => {
    document.body.innerHTML = ''
    vi.useRealTimers()
  })

  it('lists accounts with their state, and offers no deactivation of your own account', async () => {
    const wrapper = await mountAccounts()

    expect(wrapper.findAll('[data-testid="account-name"]').map((n) => n.text())).toEqual(['Morgan Reyes', 'Dr Mei Tanaka', 'Dr Noah Fitzgerald'])
    expect(wrapper.find('[data-testid="account-status-acc-2"]').text()).toBe('Invited')
    expect(wrapper.find('[data-testid="account-state-me"]').exists()).toBe(false)
    expect(wrapper.find('[data-testid="account-state-acc-1"]').attributes('aria-label')).toBe('Deactivate Dr Mei Tanaka')
    expect(wrapper.find('[data-testid="account-resend-acc-2"]').exists()).toBe(true)
    expect(wrapper.find('[data-testid="account-resend-acc-1"]').exists()).toBe(false)
  })

  it('a search asks the server again from page 1', async () => {
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout'] })
    await mountAccounts()

    await type('account-search', 'tanaka')
    await vi.advanceTimersByTimeAsync(400)
    await flushPromises()

    expect(accounts.fetchAccounts).toHaveBeenLastCalledWith(expect.objectContaining({ search: 'tanaka', page: 1 }))
  })

  it('the invite dialog checks fields before sending, then shows the server’s field errors', async () => {
    vi.mocked(accounts.inviteAccount).mockRejectedValue(
      httpError(409, 'email-taken', 'Some fields need attention', { email: 'An account with this e-mail address already exists' }),
    )
    const wrapper = await mountAccounts()
    await wrapper.find('[data-testid="account-invite"]').trigger('click')
    await flushPromises()

    byTestId('account-save')!.click()
    await flushPromises()
    expect(byTestId('account-email')!.textContent).toContain('Enter a valid e-mail address')
    expect(byTestId('account-roles-error')!.textContent).toContain('Choose at least one role')
    expect(accounts.inviteAccount).not.toHaveBeenCalled()

    await type('account-email', 'mei.tanaka@saltmarsh.test')
    await type('account-display-name', 'Dr Mei Tanaka')
    byTestId('account-role-resident')!.querySelector('input')!.click()
    await flushPromises()
    byTestId('account-save')!.click()
    await flushPromises()

    expect(accounts.inviteAccount).toHaveBeenCalledWith({ email: 'mei.tanaka@saltmarsh.test', displayName: 'Dr Mei Tanaka', roles: ['resident'], teamIds: [] })
    expect(byTestId('account-email')!.textContent).toContain('An account with this e-mail address already exists')
    expect(byTestId('account-dialog-error')).toBeNull()
  })

  it('the edit dialog sends name, roles and teams and shows a refusal on the roles field', async () => {
    vi.mocked(accounts.updateAccount).mockRejectedValue(
      httpError(409, 'last-admin', 'Some fields need attention', { roles: 'This is the only active admin; make someone else an admin first' }),
    )
    const wrapper = await mountAccounts()
    await wrapper.find('[data-testid="account-edit-me"]').trigger('click')
    await flushPromises()

    expect(byTestId('account-email-readonly')!.textContent).toBe('admin@saltmarsh.test')
    byTestId('account-role-admin')!.querySelector('input')!.click()
    await flushPromises()
    byTestId('account-role-educator')!.querySelector('input')!.click()
    await flushPromises()
    byTestId('account-save')!.click()
    await flushPromises()

    expect(accounts.updateAccount).toHaveBeenCalledWith('me', { displayName: 'Morgan Reyes', roles: ['educator'], teamIds: [] })
    expect(byTestId('account-roles-error')!.textContent).toContain('only active admin')
  })

  it('deactivation asks for confirmation first and then shows the account as deactivated', async () => {
    vi.mocked(accounts.deactivateAccount).mockResolvedValue({ ...mei, active: false, status: 'deactivated', deactivatedAt: '2026-12-07T10:00:00.000Z' })
    const wrapper = await mountAccounts()

    await wrapper.find('[data-testid="account-state-acc-1"]').trigger('click')
    await flushPromises()
    expect(byTestId('account-state-dialog')!.textContent).toContain('signed out at once')
    expect(accounts.deactivateAccount).not.toHaveBeenCalled()
    byTestId('account-state-confirm')!.click()
    await flushPromises()

    expect(accounts.deactivateAccount).toHaveBeenCalledWith('acc-1')
    expect(wrapper.find('[data-testid="account-status-acc-1"]').text()).toBe('Deactivated')
  })
})
