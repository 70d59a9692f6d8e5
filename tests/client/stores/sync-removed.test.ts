import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import type { Exam } from '#shared/schemas/exam'
import type { User } from '#shared/schemas/user'
import { getUser } from '../../../server/users/users.service.ts'
import { makeExamInput } from '../../server/factories/exam.ts'
import { makeCaller, makeTeam } from '../../server/helpers.ts'
import { db } from '@/db'
import { saveDraft } from '@/db/drafts'
import { useSessionStore } from '@/stores/session'
import { pullInto } from '@/stores/sync-cycle'
import { useSyncStore } from '@/stores/sync'
import { makeDraft } from '../factories/draft'
import { startSyncServer } from './sync-server'

let server: Awaited<ReturnType<typeof startSyncServer>>

beforeAll(async () => {
  server = await startSyncServer()
})

afterAll(async () => {
  await server.close()
})

interface Person {
  user: User
  token: string
}

/** One call to the real API over loopback, as the person. */
async function call(person: Person, method: string, path: string, body?: object): Promise<Exam> {
  const res = await fetch(`${server.base}${path}`, {
    method,
    headers: { Authorization: `Bearer ${person.token}`, 'Content-Type': 'application/json' },
    body: body && JSON.stringify(body),
  })
  if (!res.ok) throw new Error(`${method} ${path}: ${res.status} ${await res.text()}`)
  return (await res.json()) as Exam
}

async function person(roles: User['roles'], teamId: string): Promise<Person> {
  const caller = await makeCaller({ roles, teamIds: [teamId] })
  return { user: (await getUser(caller.user.id))!, token: caller.auth.slice('Bearer '.length) }
}

/** A ward whose resident submitted exams that the attending returned: the attending may read them. */
async function wardWithReturnedExams(count: number) {
  const team = await makeTeam()
  const resident = await person(['resident'], team.id)
  const attending = await person(['attending'], team.id)
  const exams: Exam[] = []
  for (let i = 0; i < count; i++) {
    const created = await call(resident, 'POST', 'exams', makeExamInput({ teamId: team.id, patientCode: `SM-07${i}0` }))
    const submitted = await call(resident, 'POST', `exams/${created.id}/submit`, { baseVersion: created.version })
    exams.push(await call(attending, 'POST', `exams/${created.id}/return`, { comment: 'Recheck the angle', baseVersion: submitted.version }))
  }
  return { team, resident, attending, exams }
}

const amend = (resident: Person, exam: Exam) => call(resident, 'POST', `exams/${exam.id}/amend`, { baseVersion: exam.version })

function signInAs(account: Person) {
  Object.assign(useSessionStore(), { user: account.user, token: account.token })
}

const copyOf = (id: string) => db.exams.get(id)

describe('sync drops the copies of exams the user may no longer read', () => {
  beforeEach(async () => {
    setActivePinia(createPinia())
    await Promise.all([db.drafts.clear(), db.exams.clear(), db.outbox.clear(), db.meta.clear()])
    server.clientTimeout(10_000)
  })

  afterEach(() => {
    useSyncStore().stop()
  })

  it('when the author amends an exam back to draft, the attending’s device drops its copy and keeps the others', async () => {
    const { resident, attending, exams } = await wardWithReturnedExams(2)
    const [amended, kept] = exams as [Exam, Exam]
    signInAs(attending)
    await useSyncStore().syncNow()
    expect(await copyOf(amended.id)).toMatchObject({ status: 'returned', ownerId: attending.user.id })

    await amend(resident, amended)
    await useSyncStore().syncNow()

    expect(await copyOf(amended.id)).toBeUndefined()
    expect(await copyOf(kept.id)).toMatchObject({ status: 'returned', ownerId: attending.user.id })
    expect(useSyncStore().lastError).toBeNull()
  })

  it('a removed id drops the read copy but never the user’s pending outbox change or draft of the same id', async () => {
    const { resident, attending, exams } = await wardWithReturnedExams(2)
    const [plainCopy, withWork] = exams as [Exam, Exam]
    const account = { id: attending.user.id, token: attending.token, isCurrent: () => true }
    expect(await pullInto(account)).toBeNull()
    const payload = makeExamInput({ teamId: withWork.teamId, id: withWork.id })
    await db.outbox.add({
      examId: withWork.id,
      authorId: attending.user.id,
      payload,
      baseVersion: withWork.version,
      state: 'pending',
      attempts: 0,
      lastError: null,
      serverCopy: null,
      queuedAt: new Date().toISOString(),
    })
    await saveDraft(makeDraft({ patientCode: 'SM-0999' }, { id: withWork.id }))

    await amend(resident, plainCopy)
    await amend(resident, withWork)
    const error = await pullInto(account)

    expect(error).toBeNull()
    expect(await copyOf(plainCopy.id)).toBeUndefined()
    expect(await db.outbox.toArray()).toMatchObject([{ examId: withWork.id, authorId: attending.user.id, state: 'pending', payload: { id: withWork.id } }])
    expect(await copyOf(withWork.id)).toMatchObject({ id: withWork.id, ownerId: attending.user.id })
    expect((await db.drafts.get(withWork.id))?.fields.patientCode).toBe('SM-0999')
  })
})
