import { describe, expect, it, vi } from 'vitest'
import { RetryQueue, type RetryQueueOptions } from '../../../server/mail/retry-queue.ts'
import { captureLog } from './capture-log.ts'

const refused = Object.assign(new Error('connect ECONNREFUSED'), { code: 'ECONNREFUSED' })
const rejected = Object.assign(new Error('550 mailbox unavailable'), { code: 'EENVELOPE', responseCode: 550 })

function makeQueue(options: Partial<RetryQueueOptions<string>> = {}) {
  const { log, lines } = captureLog()
  const queue = new RetryQueue<string>({
    deliver: () => Promise.reject(refused),
    describe: () => ({ template: 'test' }),
    isPermanent: (err) => err === rejected,
    log,
    retryDelaysMs: [1, 2],
    maxAttempts: 5,
    ...options,
  })
  return { queue, lines }
}

describe('retry queue', () => {
  it('waits the listed delays between attempts, repeating the last one, then gives up', async () => {
    const { queue, lines } = makeQueue()

    queue.add('item')
    await queue.idle()

    expect(lines.filter((l) => l.msg === 'not delivered; will retry').map((l) => l.retryInMs)).toEqual([1, 2, 2, 2])
    expect(lines.filter((l) => l.msg === 'given up')).toHaveLength(1)
    expect(queue.size).toBe(0)
  })

  it('gives up at once on a failure that retrying cannot cure', async () => {
    const { queue, lines } = makeQueue({ deliver: () => Promise.reject(rejected) })

    queue.add('item')
    await queue.idle()

    expect(lines.map((l) => l.msg)).toEqual(['given up'])
    expect(lines[0]).toMatchObject({ attempt: 1, responseCode: 550 })
  })

  it('delivers every item it is given, in order', async () => {
    const delivered: string[] = []
    const { queue } = makeQueue({ deliver: async (item) => void delivered.push(item) })

    for (const item of ['a', 'b', 'c']) queue.add(item)
    await queue.idle()

    expect(delivered).toEqual(['a', 'b', 'c'])
  })

  it('when closed, stops delivering, drops what waits and lets idle() resolve', async () => {
    const { queue, lines } = makeQueue({ retryDelaysMs: [60_000] })
    queue.add('item')
    await vi.waitFor(() => expect(lines).toHaveLength(1))
    const idle = queue.idle()

    queue.close()
    await idle

    expect(queue.size).toBe(0)
    expect(lines.at(-1)).toMatchObject({ msg: 'queue closed with items undelivered', dropped: 1 })
  })
})
