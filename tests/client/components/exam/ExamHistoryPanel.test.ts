import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createVuetify } from 'vuetify'
import type { AuditEvent } from '#shared/schemas/audit'
import type { Role } from '#shared/schemas/user'
import ExamHistoryPanel from '@/components/exam/ExamHistoryPanel.vue'
import { useSessionStore } from '@/stores/session'
import * as supervision from '@/api/supervision'
import * as teamsApi from '@/api/teams'
import { formatDateTime } from '@/utils/format'
import { makeUser } from '../../factories/user'

vi.mock('@/api/supervision')
vi.mock('@/api/teams')

function makeEvent(overrides: Partial<AuditEvent> = {}): AuditEvent {
  return {
    id: 7,
    at: '2026-03-14T09:40:00.000Z',
    actorId: 'u-1',
    actorName: 'Dr Sam Whitcombe',
    action: 'exam-update',
    entityType: 'exam',
    entityId: 'exam-1',
    changes: {
      teamId: { from: 'team-7n', to: 'team-icu' },
      abdominojugular: { from: { done: false }, to: { done: true, riseCm: 0 } },
      venousSigns: { from: { 'double-peaked': 'not-tested' }, to: { 'double-peaked': 'present' } },
      version: { from: 1, to: 2 },
    },
    ...overrides,
  }
}

async function openPanel(roles: Role[]) {
  useSessionStore().user = makeUser({ id: 'u-9', roles })
  const wrapper = mount(ExamHistoryPanel, {
    props: { examId: 'exam-1', updatedAt: '2026-03-14T09:40:00.000Z' },
    global: { plugins: [createVuetify()] },
    attachTo: document.body,
  })
  await wrapper.find('[data-testid="exam-history-toggle"]').trigger('click')
  await flushPromises()
  return wrapper
}

describe('ExamHistoryPanel', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.mocked(supervision.fetchExamHistory).mockResolvedValue([makeEvent()])
    vi.mocked(teamsApi.fetchTeams).mockResolvedValue([
      { id: 'team-7n', name: 'Ward 7 North', members: [] },
      { id: 'team-icu', name: 'Intensive care', members: [] },
    ])
  })

  afterEach(() => {
    document.body.innerHTML = ''
  })

  it("shows each change with the form's labels and values, team names and the app's time format, and no raw ids", async () => {
    const wrapper = await openPanel(['resident'])

    const text = wrapper.find('[data-testid="exam-history-event"]').text()
    expect(text).toContain('Exam changed')
    expect(text).toContain(formatDateTime('2026-03-14T09:40:00.000Z'))
    expect(text).toContain('Team: Ward 7 North → Intensive care')
    expect(text).toContain('Abdominojugular test: Not done → Done, no rise')
    expect(text).toContain('Double-peaked: not tested → present')
    expect(text).not.toContain('team-icu')
    expect(text).not.toContain('Version')
    expect(wrapper.find('[data-testid="exam-history-details"]').exists()).toBe(false)
  })

  it('for an admin, the "Details" switch shows the stored keys, ids and values', async () => {
    const wrapper = await openPanel(['admin'])

    await wrapper.find('[data-testid="exam-history-details"] input').setValue(true)

    const text = wrapper.find('[data-testid="exam-history-event"]').text()
    expect(text).toContain('exam-update')
    expect(text).toContain('teamId: team-7n → team-icu')
    expect(text).toContain('version: 1 → 2')
  })
})
