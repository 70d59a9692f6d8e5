/** A clock in milliseconds; tests pass their own so that expiry needs no waiting. */
export type Clock = () => number

export interface TtlLruOptions<V> {
  /** The most the entries may weigh together (by `weigh`; by default each entry weighs 1). */
  maxWeight: number
  /** How long an entry is served after it was stored. */
  ttlMs: number
  weigh?: (value: V) => number
  now?: Clock
}

export interface TtlLru<V> {
  get(key: string): V | undefined
  set(key: string, value: V): void
  clear(): void
  readonly size: number
}

interface Entry<V> {
  value: V
  weight: number
  expires: number
}

/**
 * A bounded least-recently-used map whose entries also expire: the bound keeps memory flat under any load, the expiry
 * bounds how long something the key cannot see (a change made behind the application's back) stays hidden.
 */
export function ttlLru<V>({ maxWeight, ttlMs, weigh = () => 1, now = () => Date.now() }: TtlLruOptions<V>): TtlLru<V> {
  // A Map iterates in insertion order: re-inserting on every hit keeps the least recently used first.
  const entries = new Map<string, Entry<V>>()
  let weight = 0
  const drop = (key: string, entry: Entry<V>) => {
    entries.delete(key)
    weight -= entry.weight
  }
  return {
    get(key) {
      const entry = entries.get(key)
      if (!entry) return undefined
      drop(key, entry)
      if (entry.expires <= now()) return undefined
      entries.set(key, entry)
      weight += entry.weight
      return entry.value
    },
    set(key, value) {
      const old = entries.get(key)
      if (old) drop(key, old)
      const entry = { value, weight: weigh(value), expires: now() + ttlMs }
      if (entry.weight > maxWeight) return
      entries.set(key, entry)
      weight += entry.weight
      for (const [oldest, first] of entries) {
        if (weight <= maxWeight) break
        drop(oldest, first)
      }
    },
    clear() {
      entries.clear()
      weight = 0
    },
    get size() {
      return entries.size
    },
  }
}
