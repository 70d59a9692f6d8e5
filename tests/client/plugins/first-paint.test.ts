import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { afterFirstPaint } from '@/plugins/first-paint'

/** A PerformanceObserver the test drives: `paint()` delivers a first-contentful-paint entry to every observer. */
function fakeObservers() {
  const observers: { callback: (list: { getEntries(): { name: string }[] }) => void; disconnected: boolean }[] = []
  class FakeObserver {
    private readonly record: (typeof observers)[number]
    constructor(callback: (typeof observers)[number]['callback']) {
      this.record = { callback, disconnected: false }
      observers.push(this.record)
    }
    observe() {}
    disconnect() {
      this.record.disconnected = true
    }
  }
  const paint = () => observers.filter((o) => !o.disconnected).forEach((o) => o.callback({ getEntries: () => [{ name: 'first-contentful-paint' }] }))
  return { FakeObserver, observers, paint }
}

describe('afterFirstPaint', () => {
  beforeEach(() => vi.useFakeTimers())
  afterEach(() => {
    vi.useRealTimers()
    vi.unstubAllGlobals()
  })

  it('waits for the first contentful paint, then runs in a task of its own, once', () => {
    const { FakeObserver, observers, paint } = fakeObservers()
    vi.stubGlobal('PerformanceObserver', FakeObserver)
    vi.spyOn(performance, 'getEntriesByType').mockReturnValue([])
    const then = vi.fn()

    afterFirstPaint(then)
    vi.advanceTimersByTime(500)
    expect(then).not.toHaveBeenCalled()
    paint()
    expect(then).not.toHaveBeenCalled()
    vi.advanceTimersByTime(0)
    expect(then).toHaveBeenCalledTimes(1)
    expect(observers[0]!.disconnected).toBe(true)
    vi.advanceTimersByTime(2_000)
    expect(then).toHaveBeenCalledTimes(1)
  })

  it('runs at once (in the next task) when the page has already painted', () => {
    vi.spyOn(performance, 'getEntriesByType').mockReturnValue([{ name: 'first-contentful-paint' } as PerformanceEntry])
    const then = vi.fn()

    afterFirstPaint(then)
    vi.advanceTimersByTime(0)

    expect(then).toHaveBeenCalledTimes(1)
  })

  it('runs after the longest wait when no paint is reported (no paint timing, or a tab in the background)', () => {
    vi.stubGlobal('PerformanceObserver', undefined)
    vi.spyOn(performance, 'getEntriesByType').mockReturnValue([])
    const then = vi.fn()

    afterFirstPaint(then, 1_000)
    vi.advanceTimersByTime(999)
    expect(then).not.toHaveBeenCalled()
    vi.advanceTimersByTime(1)
    expect(then).not.toHaveBeenCalled()
    vi.advanceTimersByTime(1)

    expect(then).toHaveBeenCalledTimes(1)
  })
})
