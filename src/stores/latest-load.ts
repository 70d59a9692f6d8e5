import { ref } from 'vue'

/**
 * A store's load whose older answers never overwrite a newer one's (filters changed while a request was out):
 * `apply` takes only the newest answer, and `loading` stays true until the newest request ends.
 */
export function latestLoad<A extends unknown[], T>(fetch: (...args: A) => Promise<T>, apply: (value: T) => void) {
  const loading = ref(false)
  let latest = 0

  async function load(...args: A) {
    const request = ++latest
    loading.value = true
    try {
      const value = await fetch(...args)
      if (request === latest) apply(value)
    } finally {
      if (request === latest) loading.value = false
    }
  }

  return { loading, load }
}
