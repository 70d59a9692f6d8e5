import type { Sequelize } from 'sequelize'
import { afterEach, describe, expect, it } from 'vitest'
import { openDatabase } from '../../../server/db/sequelize.ts'
import { insertMessage } from '../../../server/mail/outbox-store.ts'
import { sharedDatabase, tempFolder } from '../multi/app-servers.ts'
import { cleanupList, fakeSmtp, mailerOn, makeMessage, outboxRows } from './outbox-harness.ts'

const cleanups = cleanupList()
afterEach(() => cleanups.run())

/** Connections to one migrated database, each as a separate server would open it (tests/server/multi/app-servers.ts). */
async function sharedConnections(): Promise<() => Sequelize> {
  const folder = tempFolder()
  cleanups.add(folder.remove)
  const location = await sharedDatabase(folder.dir)
  return () => {
    const sequelize = openDatabase(location)
    cleanups.add(() => sequelize.close().catch(() => undefined))
    return sequelize
  }
}

/** A row taken by a server that then stopped: claimed `minutesAgo` minutes ago, one attempt counted. */
async function claimedByAStoppedServer(db: Sequelize, minutesAgo: number) {
  await insertMessage(db, makeMessage({ subject: 'Left mid-attempt' }))
  await db.query(`UPDATE "mail_outbox" SET "claimedBy" = 'gone:1:00000000', "claimedAt" = :at, "attempts" = 1`, {
    replacements: { at: new Date(Date.now() - minutesAgo * 60_000) },
  })
}

describe('the outbox shared by servers on separate connections', () => {
  it('when two servers find the same queued messages at once, each message goes out exactly once', async () => {
    const connect = await sharedConnections()
    const [db1, db2] = [connect(), connect()]
    const fake = await fakeSmtp(cleanups)
    const recipients = Array.from({ length: 30 }, (_, i) => `attending-${i}@example.test`)
    await insertMessage(db1, makeMessage({ to: recipients }))

    // Each mailer starts by sending whatever is due: both go for the same 30 rows.
    const [one, two] = [mailerOn(cleanups, db1, fake.port), mailerOn(cleanups, db2, fake.port)]
    await Promise.all([one.idle(), two.idle()])

    expect(
      fake
        .messages()
        .flatMap((m) => m.to)
        .sort(),
    ).toEqual([...recipients].sort())
    expect((await outboxRows(db1)).map((row) => [row.status, row.attempts])).toEqual(new Array(30).fill(['sent', 1]))
  })

  it('a message claimed by a server that stopped mid-attempt is sent by another once the claim is 5 minutes old', async () => {
    const connect = await sharedConnections()
    const db = connect()
    const fake = await fakeSmtp(cleanups)
    await claimedByAStoppedServer(db, 6)

    await mailerOn(cleanups, connect(), fake.port).idle()

    expect(fake.messages().map((m) => m.subject)).toEqual(['Left mid-attempt'])
    expect((await outboxRows(db)).map((row) => [row.status, row.attempts])).toEqual([['sent', 2]])
  })

  it('a claim younger than 5 minutes is left to the server holding it', async () => {
    const connect = await sharedConnections()
    const db = connect()
    const fake = await fakeSmtp(cleanups)
    await claimedByAStoppedServer(db, 1)

    await mailerOn(cleanups, connect(), fake.port).idle()

    expect(fake.messages()).toEqual([])
    expect((await outboxRows(db)).map((row) => [row.status, row.attempts])).toEqual([['queued', 1]])
  })
})
