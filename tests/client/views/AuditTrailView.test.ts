import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import type { AuditEvent } from '#shared/schemas/audit'
import AuditTrailView from '@/views/AuditTrailView.vue'
import { routes } from '@/router/routes'
import { useSessionStore } from '@/stores/session'
import * as admin from '@/api/admin'
import * as audit from '@/api/audit'
import * as teamsApi from '@/api/teams'
import { formatDateTime } from '@/utils/format'
import { makeUser } from '../factories/user'

vi.mock('@/api/audit')
vi.mock('@/api/admin')
vi.mock('@/api/teams')

function makeEvent(overrides: Partial<AuditEvent> = {}): AuditEvent {
  return {
    id: 1,
    at: '2026-03-14T09:40:00.000Z',
    actorId: 'att-1',
    actorName: 'Dr Tomas Lindqvist',
    action: 'exam-countersign',
    entityType: 'exam',
    entityId: 'exam-1',
    changes: { status: { from: 'submitted', to: 'countersigned' } },
    ...overrides,
  }
}

function pageOf(events: AuditEvent[], total = events.length) {
  return { events, total, page: 1, pageSize: 50 }
}

async function mountTrail() {
  useSessionStore().user = makeUser({ id: 'adm-1', roles: ['admin'], teams: [] })
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push({ name: 'audit-trail' })
  const wrapper = mount(AuditTrailView, { global: { plugins: [createVuetify(), router] }, attachTo: document.body })
  await flushPromises()
  return wrapper
}

const lastQuery = () => vi.mocked(audit.fetchAuditPage).mock.lastCall?.[0]

describe('AuditTrailView', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.mocked(audit.fetchAuditPage).mockReset().mockResolvedValue(pageOf([makeEvent()]))
    vi.mocked(admin.fetchUsers).mockResolvedValue([makeUser({ id: 'att-1', displayName: 'Dr Tomas Lindqvist', roles: ['attending'] })])
    vi.mocked(teamsApi.fetchTeams).mockResolvedValue([
      { id: 'team-7n', name: 'Ward 7 North', members: [] },
      { id: 'team-icu', name: 'Intensive care', members: [] },
    ])
  })

  afterEach(() => {
    document.body.innerHTML = ''
  })

  it('asks for the first page, newest first, and shows who did what, to which kind of record, with before → after in words', async () => {
    const wrapper = await mountTrail()

    const row = wrapper.find('[data-testid="audit-table"] tbody tr').text()
    expect(lastQuery()).toMatchObject({ page: 1, pageSize: 50 })
    expect(row).toContain('Dr Tomas Lindqvist')
    expect(row).toContain('Countersigned')
    expect(row).toContain('Exam')
    expect(row).toContain('Status: Submitted → Countersigned')
    expect(row).not.toContain('exam-1')
  })

  it('shows a change of team by the team names, never the ids', async () => {
    const changes = { teamId: { from: 'team-7n', to: 'team-icu' } }
    vi.mocked(audit.fetchAuditPage).mockResolvedValue(pageOf([makeEvent({ action: 'exam-update', changes })]))

    const wrapper = await mountTrail()

    expect(wrapper.find('[data-testid="audit-changes"]').text()).toBe('Team: Ward 7 North → Intensive care')
  })

  it('when "Details" is switched on, shows the record id, the action key and the values as stored', async () => {
    const wrapper = await mountTrail()

    await wrapper.find('[data-testid="audit-details"] input').setValue(true)

    const row = wrapper.find('[data-testid="audit-table"] tbody tr').text()
    expect(wrapper.find('[data-testid="audit-entity-id"]').text()).toBe('exam-1')
    expect(row).toContain('exam-countersign')
    expect(row).toContain('status: submitted → countersigned')
  })

  it('when an actor is chosen from the accounts, asks for that actor\'s events', async () => {
    const wrapper = await mountTrail()

    await wrapper.findComponent({ name: 'VAutocomplete' }).setValue('att-1')
    await flushPromises()

    expect(lastQuery()).toMatchObject({ actorId: 'att-1', page: 1 })
  })

  it('when a record id is entered, asks for that record\'s events from the first page', async () => {
    const wrapper = await mountTrail()
    const input = wrapper.find('[data-testid="audit-filter-entity"] input')

    await input.setValue('exam-7')
    await input.trigger('change')
    await flushPromises()

    expect(lastQuery()).toMatchObject({ entityId: 'exam-7', page: 1 })
  })

  it('when a date range is chosen, sends the start and end of those local days', async () => {
    const wrapper = await mountTrail()

    await wrapper.find('[data-testid="audit-filter-from"] input').setValue('2026-03-01')
    await wrapper.find('[data-testid="audit-filter-to"] input').setValue('2026-03-31')
    await flushPromises()

    expect(lastQuery()).toMatchObject({
      from: new Date('2026-03-01T00:00:00').toISOString(),
      to: new Date('2026-03-31T23:59:59.999').toISOString(),
    })
  })

  it('when an action is typed, asks for that action only', async () => {
    const wrapper = await mountTrail()
    const input = wrapper.find('[data-testid="audit-filter-action"] input')

    await input.setValue('login-failed')
    await input.trigger('blur')
    await flushPromises()

    expect(lastQuery()).toMatchObject({ action: 'login-failed' })
  })

  it('shows a failure detail that is not a change as its value', async () => {
    vi.mocked(audit.fetchAuditPage).mockResolvedValue(pageOf([makeEvent({ action: 'exam-countersign-failed', changes: { reason: 'wrong-password' } })]))

    const wrapper = await mountTrail()

    expect(wrapper.find('[data-testid="audit-changes"]').text()).toBe('Reason: Wrong password')
  })

  it('when nothing matches, says so', async () => {
    vi.mocked(audit.fetchAuditPage).mockResolvedValue(pageOf([]))

    const wrapper = await mountTrail()

    expect(wrapper.find('[data-testid="audit-empty"]').exists()).toBe(true)
  })

  it('"Verify the chain", when the chain is intact, says how many entries were verified and shows the last entry\'s hash', async () => {
    vi.mocked(audit.verifyAuditChain).mockResolvedValue({
      ok: true,
      checkedRows: 412,
      head: { seq: 412, hash: 'ab'.repeat(32), at: '2026-03-14T09:40:00.000Z' },
      firstBreak: null,
      verifiedAt: '2026-03-14T10:00:00.000Z',
    })
    const wrapper = await mountTrail()

    await wrapper.find('[data-testid="chain-verify"]').trigger('click')
    await flushPromises()

    expect(wrapper.find('[data-testid="chain-ok"]').text()).toContain('Chain intact: 412 entries verified')
    expect(wrapper.find('[data-testid="chain-head-hash"]').text()).toBe('ab'.repeat(32))
  })

  it('"Verify the chain", when a row is missing, names what is wrong, where and when', async () => {
    vi.mocked(audit.verifyAuditChain).mockResolvedValue({
      ok: false,
      checkedRows: 2,
      head: { seq: 2, hash: 'cd'.repeat(32), at: '2026-03-14T09:00:00.000Z' },
      firstBreak: { kind: 'missing-row', seq: 3, at: '2026-03-14T09:40:00.000Z', message: 'Row 3 is missing: the chain goes from row 2 to row 4' },
      verifiedAt: '2026-03-14T10:00:00.000Z',
    })
    const wrapper = await mountTrail()

    await wrapper.find('[data-testid="chain-verify"]').trigger('click')
    await flushPromises()

    const alert = wrapper.find('[data-testid="chain-broken"]').text()
    expect(alert).toContain('Chain broken: a row is missing at entry number 3')
    expect(alert).toContain('Row 3 is missing: the chain goes from row 2 to row 4')
    expect(alert).toContain(formatDateTime('2026-03-14T09:40:00.000Z'))
    expect(wrapper.find('[data-testid="chain-ok"]').exists()).toBe(false)
  })

  it('"Verify the chain", when the server cannot be reached, says so', async () => {
    vi.mocked(audit.verifyAuditChain).mockRejectedValue(new TypeError('Failed to fetch'))
    const wrapper = await mountTrail()

    await wrapper.find('[data-testid="chain-verify"]').trigger('click')
    await flushPromises()

    expect(wrapper.find('[data-testid="chain-error"]').exists()).toBe(true)
    expect(wrapper.find('[data-testid="chain-broken"]').exists()).toBe(false)
  })
})
