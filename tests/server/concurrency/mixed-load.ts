import { randomUUID } from 'node:crypto'
import request from 'supertest'
import type { SyncChangeInput } from '#shared/schemas/sync'
import { makeExamInput } from '../factories/exam.ts'

/** A running server, an author's `Authorization` header, their team, and a draft of theirs the PATCHes all start from. */
export interface LoadTarget {
  url: string
  auth: string
  teamId: string
  base: { id: string; version: number }
}

export type LoadKind = 'create' | 'push' | 'patch' | 'read'

/** One answered request: what was sent (ids of exams created, notes of a PATCH) and what came back. */
export interface Outcome {
  kind: LoadKind
  status: number
  ms: number
  body: unknown
  examIds: string[]
  notes?: string
}

export const EXAMS_PER_PUSH = 20

function send(kind: LoadKind, test: request.Test, sent: Pick<Outcome, 'examIds' | 'notes'>): Promise<Outcome> {
  const started = performance.now()
  return test.then((res) => ({ kind, status: res.status, ms: performance.now() - started, body: res.body, ...sent }))
}

// Each patient code once, so the load measures writing and reading, not pairing exams of one patient.
const code = () => `LD-${randomUUID().slice(0, 8)}`

function writer(target: LoadTarget, i: number): Promise<Outcome> {
  const { url, auth, teamId, base } = target
  if (i % 3 === 0) {
    const exam = makeExamInput({ teamId, patientCode: code() })
    return send('create', request(url).post('/api/exams').set('Authorization', auth).send(exam), { examIds: [exam.id] })
  }
  if (i % 3 === 1) {
    const changes: SyncChangeInput[] = Array.from({ length: EXAMS_PER_PUSH }, () => ({
      exam: makeExamInput({ teamId, patientCode: code() }),
      baseVersion: null,
    }))
    const examIds = changes.map((c) => c.exam.id)
    return send('push', request(url).post('/api/sync/push').set('Authorization', auth).send({ changes }), { examIds })
  }
  const notes = `Change ${i} to the shared draft`
  const patch = request(url).patch(`/api/exams/${base.id}`).set('Authorization', auth).send({ notes, baseVersion: base.version })
  return send('patch', patch, { examIds: [base.id], notes })
}

/**
 * Writers (in turn: a new exam, a sync push of 20 new exams, a PATCH of the shared draft at its base version) and
 * readers of the exam log, interleaved and all sent at once; resolves when every one has been answered.
 */
export function mixedLoad(target: LoadTarget, writers = 50, readers = 50): Promise<Outcome[]> {
  const read = () => send('read', request(target.url).get('/api/exams').set('Authorization', target.auth), { examIds: [] })
  const calls: Promise<Outcome>[] = []
  for (let i = 0; i < Math.max(writers, readers); i++) {
    if (i < writers) calls.push(writer(target, i))
    if (i < readers) calls.push(read())
  }
  return Promise.all(calls)
}
