import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { BUSY_TIMEOUT_MS } from '../../../server/db/sqlite-connection.ts'
import { openDatabase } from '../../../server/db/sequelize.ts'
import { writeTransaction } from '../../../server/db/transaction.ts'
import { isSqlite } from '../database-kind.ts'

describe.runIf(isSqlite)('SQLite only: one writer at a time per file, and the connection PRAGMAs', () => {
  let dir: string
  let sequelize: Sequelize

  beforeEach(async () => {
    dir = mkdtempSync(path.join(tmpdir(), 'plumbline-write-turns-'))
    sequelize = openDatabase(path.join(dir, 'plumbline.sqlite'))
    await sequelize.query('CREATE TABLE notes (text TEXT NOT NULL)')
  })

  afterEach(async () => {
    await sequelize.close()
    rmSync(dir, { recursive: true, force: true })
  })

  /** A promise and the function that settles it: lets a test hold a transaction open until it says so. */
  function gate() {
    let open: () => void = () => {}
    const opened = new Promise<void>((resolve) => (open = resolve))
    return { opened, open }
  }

  const pragma = async (name: string, transaction?: Transaction) =>
    Object.values((await sequelize.query<Record<string, unknown>>(`PRAGMA ${name}`, { type: QueryTypes.SELECT, transaction }))[0]!)[0]

  const insert = (text: string, transaction?: Transaction) =>
    sequelize.query('INSERT INTO notes (text) VALUES (?)', { replacements: [text], transaction })

  const stored = async () =>
    (await sequelize.query<{ text: string }>('SELECT text FROM notes ORDER BY rowid', { type: QueryTypes.SELECT })).map((r) => r.text)

  describe('openDatabase (a file)', () => {
    it('sets WAL, the busy timeout and synchronous FULL on every connection, a transaction’s own as well', async () => {
      const outside = [await pragma('journal_mode'), await pragma('busy_timeout'), await pragma('synchronous')]

      const inside = await writeTransaction(sequelize, async (t) => [
        await pragma('journal_mode', t),
        await pragma('busy_timeout', t),
        await pragma('synchronous', t),
      ])

      // PRAGMA synchronous reports FULL as 2 (https://www.sqlite.org/pragma.html#pragma_synchronous).
      expect(outside).toEqual(['wal', BUSY_TIMEOUT_MS, 2])
      expect(inside).toEqual(outside)
    })
  })

  describe('writeTransaction', () => {
    it('runs the writers of one database one after another, each beginning after the one before has committed', async () => {
      const events: string[] = []
      const first = gate()

      const writes = ['a', 'b', 'c'].map((name, i) =>
        writeTransaction(sequelize, async (t) => {
          events.push(`${name} begins`)
          if (i === 0) await first.opened
          await insert(name, t)
          events.push(`${name} ends`)
        }),
      )
      first.open()
      await Promise.all(writes)

      expect(events).toEqual(['a begins', 'a ends', 'b begins', 'b ends', 'c begins', 'c ends'])
      expect(await stored()).toEqual(['a', 'b', 'c'])
    })

    it('lets the next writer in after one fails, and keeps nothing of the failed one', async () => {
      const failing = writeTransaction(sequelize, async (t) => {
        await insert('rolled back', t)
        throw new Error('refused')
      })
      const next = writeTransaction(sequelize, (t) => insert('kept', t))

      await expect(failing).rejects.toThrow('refused')
      await next
      expect(await stored()).toEqual(['kept'])
    })

    it('refuses one nested in another at once, instead of waiting for its own turn forever', async () => {
      const outer = writeTransaction(sequelize, () => writeTransaction(sequelize, (t) => insert('inner', t)))

      await expect(outer).rejects.toThrow(/inside another/)
      expect(await stored()).toEqual([])
    })

    it('queues, rather than refuses, a write begun by work left running after the transaction that started it has ended', async () => {
      const afterwards = gate()
      let later: Promise<unknown> = Promise.resolve()

      await writeTransaction(sequelize, async (t) => {
        await insert('first', t)
        later = afterwards.opened.then(() => writeTransaction(sequelize, (t2) => insert('later', t2)))
      })
      afterwards.open()
      await later

      expect(await stored()).toEqual(['first', 'later'])
    })

    it('leaves readers free: a read outside the transaction is answered while it is still open', async () => {
      await insert('committed before')

      const seenInside = await writeTransaction(sequelize, async (t) => {
        await insert('not yet committed', t)
        return stored()
      })

      expect(seenInside).toEqual(['committed before'])
      expect(await stored()).toEqual(['committed before', 'not yet committed'])
    })

    it('makes a write outside any transaction wait for the open write transaction, then stores it after', async () => {
      const events: string[] = []
      const started = gate()
      const release = gate()

      const writing = writeTransaction(sequelize, async (t) => {
        started.open()
        await release.opened
        await insert('in the transaction', t)
        events.push('transaction commits')
      })
      await started.opened
      const stray = insert('outside').then(() => events.push('outside stored'))
      release.open()
      await Promise.all([writing, stray])

      expect(events).toEqual(['transaction commits', 'outside stored'])
      expect(await stored()).toEqual(['in the transaction', 'outside'])
    })
  })
})
