import { defineStore } from 'pinia'
import { ref } from 'vue'
import type { MailboxMessage, Outbox } from '#shared/schemas/mail'
import { fetchMailbox, fetchOutbox } from '@/api/mailbox'

export const useMailboxStore = defineStore('mailbox', () => {
  /** Messages the demo's SMTP catcher received, newest first. */
  const messages = ref<MailboxMessage[]>([])
  /** False where no catcher runs, as outside demo mode. */
  const available = ref(true)
  /** The outbox's newest messages with their delivery status and the counts per status; null where the server has none. */
  const outbox = ref<Outbox | null>(null)
  const loading = ref(false)

  /** Reads the outbox and the mailbox again. */
  async function load() {
    loading.value = true
    try {
      const [sent, received] = await Promise.all([fetchOutbox(), fetchMailbox()])
      outbox.value = sent
      available.value = received !== null
      messages.value = received ?? []
    } finally {
      loading.value = false
    }
  }

  return { messages, available, outbox, loading, load }
})
