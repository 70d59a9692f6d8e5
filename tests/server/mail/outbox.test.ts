import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { afterEach, describe, expect, it, vi } from 'vitest'
import { writeTransaction } from '../../../server/db/transaction.ts'
import { openDatabase } from '../../../server/db/sequelize.ts'
import { initModels } from '../../../server/models/index.ts'
import { openTestDatabase, sharedTestDatabase } from '../helpers.ts'
import { captureLog } from './capture-log.ts'
import { cleanupList, deadPort, fakeSmtp, mailerOn, makeMessage, outboxRows } from './outbox-harness.ts'

const cleanups = cleanupList()
afterEach(() => cleanups.run())

/** A migrated database file, and a way to open it again as a restarted server would. */
async function databaseFile() {
  const dir = mkdtempSync(path.join(tmpdir(), 'plumbline-outbox-'))
  const file = await sharedTestDatabase(dir)
  cleanups.add(() => rmSync(dir, { recursive: true, force: true }))
  return () => {
    const sequelize = openDatabase(file)
    initModels(sequelize)
    cleanups.add(() => sequelize.close().catch(() => undefined))
    return sequelize
  }
}

describe('the durable outbox', () => {
  it('a message queued before a restart is sent by the next server on the same database', async () => {
    const open = await databaseFile()
    const first = open()
    const before = mailerOn(cleanups, first, await deadPort())
    await writeTransaction(first, async (transaction) => {
      await before.enqueue(makeMessage({ subject: 'Queued before the restart' }), { transaction })
      before.close()
    })
    await first.close()

    const fake = await fakeSmtp(cleanups)
    const second = open()
    const after = mailerOn(cleanups, second, fake.port)
    await after.idle()

    expect(fake.messages().map((m) => m.subject)).toEqual(['Queued before the restart'])
    expect(await outboxRows(second)).toEqual([expect.objectContaining({ status: 'sent', attempts: 1 })])
  })

  it('a message given up before a restart stays failed: the next server does not send it again', async () => {
    const open = await databaseFile()
    const first = open()
    const { log, messages } = captureLog()
    const before = mailerOn(cleanups, first, await deadPort(), { log, retryDelaysMs: [0], maxAttempts: 2 })
    await before.enqueue(makeMessage({ subject: 'Tried before the restart' }))
    await vi.waitFor(() => expect(messages()).toContain('given up'), { timeout: 10_000 })
    before.close()
    const [failed] = await outboxRows(first)
    await first.close()

    const fake = await fakeSmtp(cleanups)
    const after = mailerOn(cleanups, open(), fake.port)
    await after.idle()

    expect(failed).toMatchObject({ status: 'failed', attempts: 2 })
    expect(fake.messages()).toEqual([])
  })

  it('nothing is stored or sent for a transaction that rolls back', async () => {
    const db = await openTestDatabase()
    const fake = await fakeSmtp(cleanups)
    const mailer = mailerOn(cleanups, db, fake.port)

    const action = writeTransaction(db, async (transaction) => {
      await mailer.enqueue(makeMessage({ subject: 'About an action that failed' }), { transaction })
      throw new Error('the action failed')
    })
    await expect(action).rejects.toThrow('the action failed')
    await mailer.idle()

    expect(fake.messages()).toEqual([])
    expect(await outboxRows(db)).toEqual([])
  })

  it('a message stored in a transaction leaves once the transaction commits', async () => {
    const db = await openTestDatabase()
    const fake = await fakeSmtp(cleanups)
    const mailer = mailerOn(cleanups, db, fake.port)

    await writeTransaction(db, (transaction) => mailer.enqueue(makeMessage({ subject: 'After the commit' }), { transaction }))
    await mailer.idle()

    expect(fake.messages().map((m) => m.subject)).toEqual(['After the commit'])
  })

  it('when two servers send from one outbox, each message goes out once', async () => {
    const db = await openTestDatabase()
    const fake = await fakeSmtp(cleanups)
    const one = mailerOn(cleanups, db, fake.port)
    const two = mailerOn(cleanups, db, fake.port)
    const recipients = Array.from({ length: 12 }, (_, i) => `attending-${i}@example.test`)

    await one.enqueue(makeMessage({ to: recipients }))
    two.send(makeMessage({ to: ['resident@example.test'] }))
    await Promise.all([one.idle(), two.idle()])

    expect(
      fake
        .messages()
        .flatMap((m) => m.to)
        .sort(),
    ).toEqual([...recipients, 'resident@example.test'].sort())
    expect((await outboxRows(db)).every((row) => row.status === 'sent' && row.attempts === 1)).toBe(true)
  })
})
