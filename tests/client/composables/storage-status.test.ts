import { describe, expect, it, vi } from 'vitest'
import { askForPersistentStorage, formatBytes, useStorageStatus } from '@/composables/storage-status'

const MB = 1024 * 1024
const GB = 1024 * MB

function fakeStorage({ persisted = false, grants = false, usage = 3 * MB, quota = 2 * GB } = {}) {
  return {
    persisted: vi.fn(async () => persisted),
    persist: vi.fn(async () => grants),
    estimate: vi.fn(async () => ({ usage, quota })),
  }
}

describe('storage status on this device', () => {
  it('when storage is already persistent, says so and offers no button', async () => {
    const status = useStorageStatus(fakeStorage({ persisted: true }))

    await status.refresh()

    expect(status.persistence.value).toBe('granted')
    expect(status.persistenceText.value).toMatch(/^Granted/)
    expect(status.canAsk.value).toBe(false)
  })

  it('reports usage and quota in readable units', async () => {
    const status = useStorageStatus(fakeStorage({ usage: 3 * MB, quota: 2 * GB }))

    await status.refresh()

    expect(status.estimateText.value).toBe('3.0 MB used of about 2.0 GB available to Plumbline.')
  })

  it('when not persistent, offers to ask, and shows the grant', async () => {
    const storage = fakeStorage({ persisted: false, grants: true })
    const status = useStorageStatus(storage)
    await status.refresh()
    expect(status.canAsk.value).toBe(true)

    await status.askForPersistence()

    expect(storage.persist).toHaveBeenCalledOnce()
    expect(status.persistence.value).toBe('granted')
  })

  it('when the browser refuses, says the data may be cleared', async () => {
    const status = useStorageStatus(fakeStorage({ persisted: false, grants: false }))

    await status.askForPersistence()

    expect(status.persistence.value).toBe('not-granted')
    expect(status.persistenceText.value).toContain('may clear Plumbline’s data')
  })

  it('without navigator.storage (iOS home screen, some private modes), explains instead of staying silent', async () => {
    const status = useStorageStatus(undefined)

    await status.refresh()

    expect(status.persistence.value).toBe('unsupported')
    expect(status.persistenceText.value).toContain('Not available in this browser')
    expect(status.estimateText.value).toContain('does not report')
    expect(status.canAsk.value).toBe(false)
  })

  it('when the browser throws (private mode), reports that it could not check', async () => {
    const status = useStorageStatus({
      persisted: () => Promise.reject(new DOMException('denied', 'InvalidStateError')),
      estimate: () => Promise.reject(new DOMException('denied', 'SecurityError')),
    })

    await status.refresh()

    expect(status.persistence.value).toBe('failed')
    expect(status.persistenceText.value).toContain('Could not be checked')
    expect(status.estimateText.value).toContain('did not report')
  })

  it('asking when persistence is already granted does not ask again', async () => {
    const storage = fakeStorage({ persisted: true })

    expect(await askForPersistentStorage(storage)).toBe('granted')
    expect(storage.persist).not.toHaveBeenCalled()
  })

  it('formats byte counts', () => {
    expect(formatBytes(0)).toBe('0 B')
    expect(formatBytes(512)).toBe('512 B')
    expect(formatBytes(1536)).toBe('1.5 KB')
    expect(formatBytes(12 * MB)).toBe('12 MB')
    expect(formatBytes(2.34 * GB)).toBe('2.3 GB')
  })
})
