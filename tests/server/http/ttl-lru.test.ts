import { describe, expect, it } from 'vitest'
import { ttlLru } from '../../../server/http/ttl-lru.ts'

function clock() {
  let now = 1_000
  return { now: () => now, advance: (ms: number) => (now += ms) }
}

describe('ttlLru', () => {
  it('answers what was stored under a key, and nothing for another key', () => {
    const cache = ttlLru<string>({ maxWeight: 10, ttlMs: 1_000 })

    cache.set('a', 'first')

    expect([cache.get('a'), cache.get('b')]).toEqual(['first', undefined])
  })

  it('when full, drops the least recently used entry, counting a read as a use', () => {
    const cache = ttlLru<string>({ maxWeight: 2, ttlMs: 1_000 })
    cache.set('a', 'A')
    cache.set('b', 'B')
    cache.get('a')

    cache.set('c', 'C')

    expect([cache.get('a'), cache.get('b'), cache.get('c')]).toEqual(['A', undefined, 'C'])
  })

  it('bounds the entries by their weight, and never keeps one heavier than the bound', () => {
    const cache = ttlLru<string>({ maxWeight: 5, ttlMs: 1_000, weigh: (v) => v.length })
    cache.set('a', 'aaa')
    cache.set('b', 'bb')

    cache.set('c', 'cc')
    cache.set('huge', 'xxxxxx')

    expect([cache.get('a'), cache.get('b'), cache.get('c'), cache.get('huge')]).toEqual([undefined, 'bb', 'cc', undefined])
  })

  it('stops answering an entry once its time to live has passed, and answers one stored again', () => {
    const time = clock()
    const cache = ttlLru<string>({ maxWeight: 10, ttlMs: 5_000, now: time.now })
    cache.set('a', 'old')

    time.advance(4_999)
    const before = cache.get('a')
    time.advance(1)
    const after = cache.get('a')
    cache.set('a', 'new')

    expect([before, after, cache.get('a'), cache.size]).toEqual(['old', undefined, 'new', 1])
  })

  it('empties on clear', () => {
    const cache = ttlLru<string>({ maxWeight: 10, ttlMs: 1_000 })
    cache.set('a', 'A')

    cache.clear()

    expect([cache.get('a'), cache.size]).toEqual([undefined, 0])
  })
})
