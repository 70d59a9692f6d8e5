import { execFile } from 'node:child_process'
import { copyFileSync, existsSync, readdirSync, writeFileSync } from 'node:fs'
import path from 'node:path'
import { promisify } from 'node:util'
import request from 'supertest'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { checkPlumblineDatabase } from '../../../server/db/database-check.ts'
import { backupDatabase } from '../../../server/db/sqlite-backup.ts'
import { all, withFile } from '../../../server/db/sqlite-file.ts'
import { DatabaseInUse, restoreDatabase } from '../../../server/db/sqlite-restore.ts'
import { makeExamInput } from '../factories/exam.ts'
import { makeCaller, makeTeam } from '../helpers.ts'
import { startFileServer } from '../concurrency/file-server.ts'
import { isSqlite } from '../database-kind.ts'

describe.runIf(isSqlite)('SQLite only: the backup and restore of the database file (PostgreSQL: pg_dump and pg_restore)', () => {
  let running: Awaited<ReturnType<typeof startFileServer>>

  beforeEach(async () => {
    running = await startFileServer()
  })

  afterEach(async () => {
    await running.remove()
  })

  const inDir = (name: string) => path.join(running.dir, name)

  /** The ids of the exams in a database file, and how many of them have their creation in the audit trail. */
  async function examsIn(file: string) {
    return withFile(file, async (db) => ({
      ids: new Set((await all<{ id: string }>(db, 'SELECT id FROM exams')).map((r) => r.id)),
      audited: (await all<{ n: number }>(db, `SELECT count(*) AS n FROM audit_events WHERE action = 'exam-create'`))[0]!.n,
    }))
  }

  /** Writers recording exams one after another until stopped; `acknowledged` lists each exam once its 201 has arrived. */
  function keepWriting(url: string, auth: string, teamId: string, writers = 3) {
    const acknowledged: string[] = []
    let stopped = false
    let firstTen: () => void = () => {}
    const tenAcknowledged = new Promise<void>((resolve) => (firstTen = resolve))
    const loop = async () => {
      while (!stopped) {
        const exam = makeExamInput({ teamId })
        const res = await request(url).post('/api/exams').set('Authorization', auth).send(exam)
        if (res.status !== 201) throw new Error(`POST /api/exams answered ${res.status}`)
        if (acknowledged.push(exam.id) >= 10) firstTen()
      }
    }
    const loops = Promise.all(Array.from({ length: writers }, loop))
    return { acknowledged, tenAcknowledged, stop: () => ((stopped = true), loops) }
  }

  async function writerOnTeam() {
    const team = await makeTeam()
    const resident = await makeCaller({ teamIds: [team.id] })
    return { teamId: team.id, auth: resident.auth }
  }

  describe('backupDatabase and restoreDatabase', () => {
    it('backs up while exams are being written; the restored database holds every exam acknowledged before the backup began', async () => {
      const { teamId, auth } = await writerOnTeam()
      const writing = keepWriting(running.url, auth, teamId)
      await writing.tenAcknowledged

      const before = [...writing.acknowledged]
      await backupDatabase(running.file, inDir('backup.sqlite'))
      await writing.stop()
      await running.close()
      const restored = await restoreDatabase(inDir('backup.sqlite'), running.file, inDir('aside'))

      const inRestored = await examsIn(running.file)
      expect(before.filter((id) => !inRestored.ids.has(id))).toEqual([])
      // One transaction writes an exam and its audit event: a consistent copy has both or neither.
      expect(inRestored.audited).toBe(inRestored.ids.size)
      const replaced = await examsIn(restored.replacedBy!)
      expect(writing.acknowledged.filter((id) => !replaced.ids.has(id))).toEqual([])
    })

    it('refuses to restore while the database is open (the server is running), and changes nothing', async () => {
      const { teamId, auth } = await writerOnTeam()
      await backupDatabase(running.file, inDir('backup.sqlite'))
      await request(running.url).post('/api/exams').set('Authorization', auth).send(makeExamInput({ teamId }))

      const restoring = restoreDatabase(inDir('backup.sqlite'), running.file, inDir('aside'))

      await expect(restoring).rejects.toBeInstanceOf(DatabaseInUse)
      expect((await examsIn(running.file)).ids.size).toBe(1)
      expect(existsSync(inDir('aside'))).toBe(false)
    })

    it('refuses a file that is not a Plumbline database, or one with a migration this version does not know', async () => {
      await running.close()
      writeFileSync(inDir('notes.txt'), 'not a database')
      copyFileSync(running.file, inDir('future.sqlite'))
      await withFile(inDir('future.sqlite'), (db) => all(db, `INSERT INTO "SequelizeMeta" (name) VALUES ('2099.01.01T00.00.00.future')`))

      const notes = await restoreDatabase(inDir('notes.txt'), running.file, inDir('aside')).catch((err: Error) => err.message)
      const future = await restoreDatabase(inDir('future.sqlite'), running.file, inDir('aside')).catch((err: Error) => err.message)

      expect(notes).toMatch(/not an undamaged SQLite database/)
      expect(future).toMatch(/2099.01.01T00.00.00.future/)
      expect(existsSync(inDir('aside'))).toBe(false)
      expect(await checkPlumblineDatabase(running.file)).toBeTruthy()
    })
  })

  // Each command starts its own Node with tsx, which takes seconds on a busy machine.
  describe('npm run backup and npm run restore', { timeout: 60_000 }, () => {
    const run = promisify(execFile)
    const cli = (script: string, args: string[]) =>
      run(process.execPath, ['--import', 'tsx', `server/db/${script}`, ...args], { env: { ...process.env, DATA_DIR: running.dir } })

    it('writes DATA_DIR/backups/plumbline-<time>.sqlite, and puts it back keeping the replaced database aside', async () => {
      const { teamId, auth } = await writerOnTeam()
      const exam = makeExamInput({ teamId })
      await request(running.url).post('/api/exams').set('Authorization', auth).send(exam)
      await running.close()

      await cli('backup-cli.ts', [])
      const [backup] = readdirSync(inDir('backups'))
      await cli('restore-cli.ts', [inDir(`backups/${backup}`)])

      expect(backup).toMatch(/^plumbline-\d{4}-\d\d-\d\dT[\d-]+Z\.sqlite$/)
      expect((await examsIn(running.file)).ids).toEqual(new Set([exam.id]))
      expect(readdirSync(inDir('backups')).filter((f) => f.startsWith('plumbline-replaced-'))).toHaveLength(1)
    })
  })
})
