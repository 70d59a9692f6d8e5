import { onBeforeUnmount, onMounted, ref, type ShallowRef } from 'vue'

/** True when the content is wider than the box shows (a pixel of rounding aside). */
export function overflowsSideways(el: { scrollWidth: number; clientWidth: number } | null): boolean {
  return !!el && el.scrollWidth > el.clientWidth + 1
}

/** Watches a box for content wider than itself, on mount and whenever it resizes, for a "scrolls sideways" hint. */
export function useSidewaysOverflow(box: Readonly<ShallowRef<HTMLElement | null>>) {
  const overflows = ref(false)
  const measure = () => (overflows.value = overflowsSideways(box.value))
  let observer: ResizeObserver | undefined
  onMounted(() => {
    measure()
    observer = new ResizeObserver(measure)
    if (box.value) observer.observe(box.value)
    window.addEventListener('resize', measure)
  })
  onBeforeUnmount(() => {
    observer?.disconnect()
    window.removeEventListener('resize', measure)
  })
  return { overflows }
}
