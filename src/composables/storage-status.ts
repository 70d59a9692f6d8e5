import { computed, ref } from 'vue'

export type PersistenceState = 'checking' | 'granted' | 'not-granted' | 'unsupported' | 'failed'
export type EstimateState = 'checking' | 'ready' | 'unsupported' | 'failed'

// iOS home-screen apps and some private modes have no navigator.storage at all (dexie/Dexie.js#739).
type MaybeStorage = Partial<Pick<StorageManager, 'persisted' | 'persist' | 'estimate'>> | undefined

function deviceStorage(): MaybeStorage {
  return typeof navigator === 'undefined' ? undefined : navigator.storage
}

/** Byte counts as people read them: 0 B, 512 B, 1.5 KB, 12 MB, 2.3 GB. */
export function formatBytes(bytes: number): string {
  const units = ['B', 'KB', 'MB', 'GB', 'TB']
  let value = bytes
  let unit = 0
  while (value >= 1024 && unit < units.length - 1) {
    value /= 1024
    unit += 1
  }
  const digits = unit === 0 || value >= 10 ? 0 : 1
  return `${value.toFixed(digits)} ${units[unit]}`
}

async function readPersisted(storage: MaybeStorage): Promise<PersistenceState> {
  if (!storage?.persisted) return 'unsupported'
  try {
    return (await storage.persisted()) ? 'granted' : 'not-granted'
  } catch {
    return 'failed'
  }
}

/** Asks the browser to keep Plumbline's data under storage pressure; resolves to the outcome, never rejects. */
export async function askForPersistentStorage(storage: MaybeStorage = deviceStorage()): Promise<PersistenceState> {
  if ((await readPersisted(storage)) === 'granted') return 'granted'
  if (!storage?.persist) return 'unsupported'
  try {
    return (await storage.persist()) ? 'granted' : 'not-granted'
  } catch {
    return 'failed'
  }
}

const PERSISTENCE_TEXT: Record<PersistenceState, string> = {
  checking: 'Checking…',
  granted: 'Granted: the browser will not clear Plumbline’s data to free space.',
  'not-granted': 'Not granted: the browser may clear Plumbline’s data when the device runs low on space. Sync often.',
  unsupported: 'Not available in this browser (private browsing or an older browser). Sync often: unsynced exams could be cleared.',
  failed: 'Could not be checked (private browsing?). Sync often: unsynced exams could be cleared.',
}

/** Persistent-storage grant and storage estimate for the "This device" screen, with text for every outcome. */
export function useStorageStatus(storage: MaybeStorage = deviceStorage()) {
  const persistence = ref<PersistenceState>('checking')
  const estimateState = ref<EstimateState>('checking')
  const usage = ref(0)
  const quota = ref(0)
  const asking = ref(false)

  async function readEstimate() {
    if (!storage?.estimate) {
      estimateState.value = 'unsupported'
      return
    }
    try {
      const estimate = await storage.estimate()
      usage.value = estimate.usage ?? 0
      quota.value = estimate.quota ?? 0
      estimateState.value = 'ready'
    } catch {
      estimateState.value = 'failed'
    }
  }

  async function refresh() {
    const [state] = await Promise.all([readPersisted(storage), readEstimate()])
    persistence.value = state
  }

  async function askForPersistence() {
    asking.value = true
    persistence.value = await askForPersistentStorage(storage).finally(() => (asking.value = false))
  }

  const canAsk = computed(() => persistence.value === 'not-granted' && !!storage?.persist)
  const persistenceText = computed(() => PERSISTENCE_TEXT[persistence.value])
  const estimateText = computed(() => {
    if (estimateState.value === 'checking') return 'Checking…'
    if (estimateState.value === 'unsupported') return 'This browser does not report how much storage Plumbline uses.'
    if (estimateState.value === 'failed') return 'The browser did not report storage use (private browsing?).'
    if (!quota.value) return `${formatBytes(usage.value)} used; the browser reports no limit.`
    return `${formatBytes(usage.value)} used of about ${formatBytes(quota.value)} available to Plumbline.`
  })

  return { persistence, estimateState, usage, quota, asking, canAsk, persistenceText, estimateText, refresh, askForPersistence }
}
