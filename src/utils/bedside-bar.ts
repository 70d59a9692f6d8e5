import { onBeforeUnmount, onMounted, type Ref } from 'vue'

// The on-screen keyboard shrinks the visual viewport, not the layout viewport: the bar sits above the keyboard.
function visibleBottom() {
  const viewport = window.visualViewport
  return viewport ? viewport.offsetTop + viewport.height : window.innerHeight
}

// Only fields the user types into: a button or box focused by a press must not move under the finger mid-tap.
const TYPED =
  'textarea, [contenteditable="true"], input:not([type="checkbox"], [type="radio"], [type="range"], [type="button"], [type="submit"])'

/**
 * Keeps the field being filled above a sticky action bar: the page's scroll padding equals the bar's height (so the
 * browser's own focus scrolling stops above it), and a field the bar still covers on focus is scrolled into view.
 */
export function useBarKeepsFocusVisible(bar: Ref<HTMLElement | null>) {
  const root = document.documentElement
  const setPadding = () => (root.style.scrollPaddingBottom = `${bar.value?.offsetHeight ?? 0}px`)

  function keepAbove(field: Element | null) {
    if (!(field instanceof HTMLElement) || !field.matches(TYPED) || !bar.value || bar.value.contains(field)) return
    setPadding()
    const barTop = Math.min(bar.value.getBoundingClientRect().top, visibleBottom() - bar.value.offsetHeight)
    if (field.getBoundingClientRect().bottom > barTop) field.scrollIntoView?.({ block: 'center', behavior: 'instant' })
  }

  // After the browser's own focus scrolling (which runs after the focus event), and again when the keyboard opens.
  const onFocus = (event: FocusEvent) => requestAnimationFrame(() => keepAbove(event.target as Element | null))
  const onViewportResize = () => keepAbove(document.activeElement)

  onMounted(() => {
    setPadding()
    document.addEventListener('focusin', onFocus)
    window.visualViewport?.addEventListener('resize', onViewportResize)
  })
  onBeforeUnmount(() => {
    document.removeEventListener('focusin', onFocus)
    window.visualViewport?.removeEventListener('resize', onViewportResize)
    root.style.scrollPaddingBottom = ''
  })
}
