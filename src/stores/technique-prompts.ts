import { defineStore } from 'pinia'
import { ref } from 'vue'
import { loadDismissedPrompts, saveDismissedPrompts } from '@/db/technique-prompts'

export const useTechniquePromptsStore = defineStore('technique-prompts', () => {
  /** Codes of the technique prompts dismissed on this device. */
  const dismissed = ref<string[]>([])
  const loaded = ref(false)

  /** Reads the dismissed prompts once; a device that cannot read them shows every prompt. */
  async function load() {
    if (loaded.value) return
    dismissed.value = await loadDismissedPrompts().catch(() => [])
    loaded.value = true
  }

  /** Hides a prompt on this device from now on; the prompt leaves the screen even if storing the choice fails. */
  async function dismiss(code: string) {
    if (dismissed.value.includes(code)) return
    dismissed.value = [...dismissed.value, code]
    await saveDismissedPrompts(dismissed.value).catch(() => undefined)
  }

  /** Shows every prompt again. */
  async function restoreAll() {
    dismissed.value = []
    await saveDismissedPrompts([]).catch(() => undefined)
  }

  return { dismissed, loaded, load, dismiss, restoreAll }
})
