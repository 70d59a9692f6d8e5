import { getCurrentScope, onScopeDispose, ref } from 'vue'

export type InclinationSensorState = 'idle' | 'measuring' | 'denied' | 'unavailable'

interface OrientationEventClass {
  requestPermission?: () => Promise<'granted' | 'denied' | 'default'>
}

export interface DeviceInclinationOptions {
  target?: Window
  /** How long to wait for a first reading before calling the sensor unavailable. */
  timeoutMs?: number
}

const SMOOTHING_WINDOW = 8

/** Trunk angle from a phone laid along the bed back: beta is its front-to-back tilt, whichever end points at the head. */
export function inclinationFromBeta(beta: number): number {
  const tilt = Math.abs(beta)
  return Math.min(tilt, 180 - tilt)
}

/** Live inclination from DeviceOrientation, smoothed over the last readings; `start` must run from a tap (iOS permission). */
export function useDeviceInclination({ target = window, timeoutMs = 2000 }: DeviceInclinationOptions = {}) {
  const state = ref<InclinationSensorState>('idle')
  const angle = ref<number | null>(null)
  const readings: number[] = []
  let timeout: ReturnType<typeof setTimeout> | undefined

  function onOrientation(event: Event) {
    const beta = (event as DeviceOrientationEvent).beta
    if (beta === null || beta === undefined || Number.isNaN(beta)) return
    clearTimeout(timeout)
    readings.push(inclinationFromBeta(beta))
    if (readings.length > SMOOTHING_WINDOW) readings.shift()
    angle.value = Math.round(readings.reduce((sum, value) => sum + value, 0) / readings.length)
  }

  function stop(next: InclinationSensorState = 'idle') {
    clearTimeout(timeout)
    target.removeEventListener('deviceorientation', onOrientation)
    state.value = next
  }

  async function permitted(eventClass: OrientationEventClass) {
    if (typeof eventClass.requestPermission !== 'function') return true
    return (await eventClass.requestPermission().catch(() => 'denied')) === 'granted'
  }

  /** Asks permission where the browser requires it, then listens; falls back to 'denied' or 'unavailable'. */
  async function start() {
    const eventClass = (target as Window & { DeviceOrientationEvent?: OrientationEventClass }).DeviceOrientationEvent
    if (!eventClass) return stop('unavailable')
    if (!(await permitted(eventClass))) return stop('denied')
    readings.length = 0
    angle.value = null
    state.value = 'measuring'
    target.addEventListener('deviceorientation', onOrientation)
    timeout = setTimeout(() => angle.value === null && stop('unavailable'), timeoutMs)
  }

  if (getCurrentScope()) onScopeDispose(() => stop())
  return { state, angle, start, stop }
}
