import { afterEach, describe, expect, it, vi } from 'vitest'
import { inclinationFromBeta, useDeviceInclination } from '@/composables/device-inclination'

type FakeWindow = Window & { DeviceOrientationEvent?: { requestPermission?: () => Promise<string> } }

function fakeWindow(requestPermission?: () => Promise<string>): FakeWindow {
  const target = new EventTarget() as FakeWindow
  target.DeviceOrientationEvent = requestPermission ? { requestPermission } : {}
  return target
}

function tilt(target: EventTarget, beta: number | null) {
  target.dispatchEvent(Object.assign(new Event('deviceorientation'), { beta }))
}

describe('inclination from the phone', () => {
  afterEach(() => {
    vi.useRealTimers()
  })

  it('reads the trunk angle whichever end of the phone points at the head', () => {
    expect(inclinationFromBeta(45)).toBe(45)
    expect(inclinationFromBeta(-30)).toBe(30)
    expect(inclinationFromBeta(120)).toBe(60)
  })

  it('follows orientation events, smoothed over the latest readings', async () => {
    const target = fakeWindow()
    const sensor = useDeviceInclination({ target })

    await sensor.start()
    tilt(target, 44)
    tilt(target, 46)

    expect(sensor.state.value).toBe('measuring')
    expect(sensor.angle.value).toBe(45)
  })

  it('asks for permission where the browser requires it (iOS) and measures once granted', async () => {
    const requestPermission = vi.fn().mockResolvedValue('granted')
    const target = fakeWindow(requestPermission)
    const sensor = useDeviceInclination({ target })

    await sensor.start()
    tilt(target, 30)

    expect(requestPermission).toHaveBeenCalledOnce()
    expect(sensor.angle.value).toBe(30)
  })

  it('when permission is refused, falls back to entry and does not listen', async () => {
    const target = fakeWindow(() => Promise.resolve('denied'))
    const sensor = useDeviceInclination({ target })

    await sensor.start()
    tilt(target, 30)

    expect(sensor.state.value).toBe('denied')
    expect(sensor.angle.value).toBeNull()
  })

  it('without the orientation API, reports the sensor unavailable', async () => {
    const target = new EventTarget() as Window
    const sensor = useDeviceInclination({ target })

    await sensor.start()

    expect(sensor.state.value).toBe('unavailable')
  })

  it('when no reading with an angle arrives in time, reports the sensor unavailable', async () => {
    vi.useFakeTimers()
    const target = fakeWindow()
    const sensor = useDeviceInclination({ target, timeoutMs: 1000 })

    await sensor.start()
    tilt(target, null)
    vi.advanceTimersByTime(1000)

    expect(sensor.state.value).toBe('unavailable')
  })
})
