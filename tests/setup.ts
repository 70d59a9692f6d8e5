import 'fake-indexeddb/auto'

// Vuetify's layout components observe their size; jsdom has no ResizeObserver.
class ResizeObserverStub {
  observe() {}
  unobserve() {}
  disconnect() {}
}
globalThis.ResizeObserver ??= ResizeObserverStub as unknown as typeof ResizeObserver

// Vuetify's overlays (snackbar, dialog) read the global visualViewport, which jsdom lacks; null is its "absent" case.
Object.assign(globalThis, { visualViewport: globalThis.visualViewport ?? null })
