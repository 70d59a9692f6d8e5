/** Longest wait for the first paint: a browser without paint timing, or a page opened in a background tab. */
const MOST_MS = 1_000

/**
 * Runs `then` in a task of its own once the page has first painted something (its first contentful paint), so what
 * the HTML itself shows is on screen before the app replaces it; at the latest after MOST_MS.
 */
export function afterFirstPaint(then: () => void, most = MOST_MS): void {
  let done = false
  let observer: PerformanceObserver | undefined
  const run = () => {
    if (done) return
    done = true
    observer?.disconnect()
    setTimeout(then)
  }
  const painted = (entries: PerformanceEntryList) => entries.some((entry) => entry.name === 'first-contentful-paint')
  if (typeof performance !== 'undefined' && painted(performance.getEntriesByType('paint'))) return run()
  if (typeof PerformanceObserver !== 'undefined') {
    observer = new PerformanceObserver((list) => painted(list.getEntries()) && run())
    try {
      observer.observe({ type: 'paint', buffered: true })
    } catch {
      observer = undefined
    }
  }
  setTimeout(run, most)
}
