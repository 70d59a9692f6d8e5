import 'fake-indexeddb/auto'
import { IDBFactory } from 'fake-indexeddb'
import { vi } from 'vitest'

// The client project runs with `isolate: false`: a worker keeps its jsdom window and the packages it has imported
// (jsdom alone takes most of a second to load). What isolation gave each file, this gives it: our own modules
// evaluated afresh, an empty IndexedDB, an empty page and storage, real timers and jsdom's own globals.
vi.resetModules()
vi.unstubAllGlobals()
vi.useRealTimers()
globalThis.indexedDB = new IDBFactory()
document.head.innerHTML = ''
document.body.innerHTML = ''
localStorage.clear()
sessionStorage.clear()

// Vuetify's layout components observe their size; jsdom has no ResizeObserver.
class ResizeObserverStub {
  observe() {}
  unobserve() {}
  disconnect() {}
}
globalThis.ResizeObserver ??= ResizeObserverStub as unknown as typeof ResizeObserver

// Vuetify's overlays (snackbar, dialog) read the global visualViewport, which jsdom lacks; null is its "absent" case.
Object.assign(globalThis, { visualViewport: globalThis.visualViewport ?? null })
