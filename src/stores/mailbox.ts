import { defineStore } from 'pinia'
import { ref } from 'vue'
import type { MailboxMessage } from '#shared/schemas/mail'
import { fetchMailbox } from '@/api/mailbox'

export const useMailboxStore = defineStore('mailbox', () => {
  /** Messages the demo's SMTP catcher received, newest first. */
  const messages = ref<MailboxMessage[]>([])
  /** False where no catcher runs, as outside demo mode. */
  const available = ref(true)
  const loading = ref(false)

  /** Reads the mailbox again. */
  async function load() {
    loading.value = true
    try {
      const received = await fetchMailbox()
      available.value = received !== null
      messages.value = received ?? []
    } finally {
      loading.value = false
    }
  }

  return { messages, available, loading, load }
})
