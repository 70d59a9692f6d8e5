import { onMounted, ref } from 'vue'
import { readApiError } from '@/api/client'

/** Runs `load` on mount and exposes a readable error message for the page. */
export function useLoadWithError(load: () => Promise<unknown>) {
  const error = ref('')

  async function run() {
    error.value = ''
    try {
      await load()
    } catch (e) {
      error.value = (await readApiError(e)).message
    }
  }

  onMounted(run)
  return { error, run }
}
