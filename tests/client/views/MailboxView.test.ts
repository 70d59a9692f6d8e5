import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import MailboxView from '@/views/MailboxView.vue'
import { routes } from '@/router/routes'
import * as mailbox from '@/api/mailbox'
import type { OutboxMessage } from '#shared/schemas/mail'

vi.mock('@/api/mailbox')

async function mountMailbox() {
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push({ name: 'mailbox' })
  const wrapper = mount(MailboxView, { global: { plugins: [createVuetify(), router] }, attachTo: document.body })
  await flushPromises()
  return wrapper
}

describe('MailboxView', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.mocked(mailbox.fetchMailbox).mockReset()
    vi.mocked(mailbox.fetchOutbox).mockReset().mockResolvedValue(null)
  })

  afterEach(() => {
    document.body.innerHTML = ''
  })

  it('lists the caught messages in the order the server gives, newest first, with subject and recipients', async () => {
    vi.mocked(mailbox.fetchMailbox).mockResolvedValue([
      { to: ['resident@saltmarsh.test'], subject: 'Exam countersigned by Dr Tomas Lindqvist', text: 'Signed.', receivedAt: '2026-03-14T10:00:00.000Z' },
      { to: ['attending@saltmarsh.test'], subject: 'Countersignature requested by Dr Sam Whitcombe', text: 'Please review.', receivedAt: '2026-03-14T09:00:00.000Z' },
    ])

    const wrapper = await mountMailbox()

    const subjects = wrapper.findAll('[data-testid="mail-subject"]').map((s) => s.text())
    expect(subjects).toEqual(['Exam countersigned by Dr Tomas Lindqvist', 'Countersignature requested by Dr Sam Whitcombe'])
    expect(wrapper.findAll('[data-testid="mail-message"]')[1]!.text()).toContain('to attending@saltmarsh.test')
  })

  it('opening a message shows its text', async () => {
    vi.mocked(mailbox.fetchMailbox).mockResolvedValue([
      { to: ['attending@saltmarsh.test'], subject: 'Countersignature requested', text: 'Open it in Plumbline.', receivedAt: '2026-03-14T09:00:00.000Z' },
    ])
    const wrapper = await mountMailbox()

    await wrapper.find('[data-testid="mail-message"] button').trigger('click')
    await flushPromises()

    expect(wrapper.find('[data-testid="mail-text"]').text()).toBe('Open it in Plumbline.')
  })

  it('where the server runs no mail catcher, says the mailbox is not available', async () => {
    vi.mocked(mailbox.fetchMailbox).mockResolvedValue(null)

    const wrapper = await mountMailbox()

    expect(wrapper.find('[data-testid="mailbox-unavailable"]').exists()).toBe(true)
    expect(wrapper.find('[data-testid="mail-list"]').exists()).toBe(false)
  })

  it('when nothing was caught yet, says so', async () => {
    vi.mocked(mailbox.fetchMailbox).mockResolvedValue([])

    const wrapper = await mountMailbox()

    expect(wrapper.find('[data-testid="mailbox-empty"]').text()).toBe('No messages yet.')
  })

  it('shows each outbox message with its status, attempts and last error, and how many there are per status', async () => {
    vi.mocked(mailbox.fetchMailbox).mockResolvedValue([])
    vi.mocked(mailbox.fetchOutbox).mockResolvedValue({
      messages: [
        makeOutboxMessage({ id: 'm-2', recipient: 'gone@saltmarsh.test', status: 'failed', attempts: 20, lastError: 'EENVELOPE 550 mailbox unavailable', nextAttemptAt: null }),
        makeOutboxMessage({ id: 'm-1', recipient: 'attending@saltmarsh.test', status: 'sent', attempts: 1, sentAt: '2026-03-14T09:00:05.000Z', nextAttemptAt: null }),
      ],
      counts: { queued: 3, sent: 1, failed: 1 },
    })

    const wrapper = await mountMailbox()

    const rows = wrapper.findAll('[data-testid="outbox-table"] tbody tr').map((r) => r.text())
    expect(rows[0]).toContain('Failed')
    expect(rows[0]).toContain('gone@saltmarsh.test')
    expect(rows[0]).toContain('20')
    expect(rows[0]).toContain('EENVELOPE 550 mailbox unavailable')
    expect(rows[1]).toContain('Sent')
    expect(wrapper.find('[data-testid="outbox-count-queued"]').text()).toBe('Queued: 3')
    expect(wrapper.find('[data-testid="outbox-count-failed"]').text()).toBe('Failed: 1')
  })

  it('where the server keeps no outbox, shows the caught mail only', async () => {
    vi.mocked(mailbox.fetchMailbox).mockResolvedValue([])

    const wrapper = await mountMailbox()

    expect(wrapper.find('[data-testid="outbox"]').exists()).toBe(false)
    expect(wrapper.find('[data-testid="mailbox-empty"]').exists()).toBe(true)
  })
})

function makeOutboxMessage(overrides: Partial<OutboxMessage> = {}): OutboxMessage {
  return {
    id: 'm-1',
    template: 'countersign-requested',
    recipient: 'attending@saltmarsh.test',
    subject: 'Countersignature requested by Dr Sam Whitcombe',
    status: 'queued',
    attempts: 0,
    nextAttemptAt: '2026-03-14T09:00:00.000Z',
    lastError: null,
    createdAt: '2026-03-14T09:00:00.000Z',
    sentAt: null,
    ...overrides,
  }
}
