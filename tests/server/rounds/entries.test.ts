import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { ExamModel } from '../../../server/models/index.ts'
import { makeExamInput, recordExam } from '../factories/exam.ts'
import { makeTestApp } from '../helpers.ts'
import { newExam, push } from '../sync/sync-calls.ts'
import { calibrationWard, closeRoundAs, detailAs, openRound, recordEntry } from './round-setup.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

async function createAs(auth: string, body: Record<string, unknown>) {
  return request(app).post('/api/exams').set('Authorization', auth).send(body)
}

describe('an exam as a round entry (roundId on POST/PATCH /api/exams and sync push)', () => {
  it('an examiner of the open round records one of its codes; the exam carries the roundId and the grid shows it', async () => {
    const { ward, educator, examiners } = await calibrationWard(2)
    const round = await openRound(app, educator, ['SM-0301', 'SM-0302'], examiners)

    const exam = await recordEntry(app, examiners[0]!, ward.id, round.id, 'SM-0302', 5)

    expect(exam.roundId).toBe(round.id)
    const { round: detail } = await detailAs(app, examiners[0]!.auth, round.id)
    const cell = detail!.entries.find((e) => e.examinerId === examiners[0]!.user.id && e.patientCode === 'SM-0302')
    expect(cell).toMatchObject({ state: 'recorded', examId: exam.id, heightCm: 5 })
    expect(detail!.recorded).toBe(1)
  })

  it('refuses a code outside the round, an examiner outside it, an unknown round: field-level 400s, nothing stored', async () => {
    const { ward, educator, examiners, outsider } = await calibrationWard(2)
    const round = await openRound(app, educator, ['SM-0301'], examiners)

    const wrongCode = await createAs(examiners[0]!.auth, makeExamInput({ teamId: ward.id, roundId: round.id, patientCode: 'SM-0999' }))
    const notMember = await createAs(outsider.auth, makeExamInput({ teamId: ward.id, roundId: round.id, patientCode: 'SM-0301' }))
    const unknown = await createAs(examiners[0]!.auth, makeExamInput({ teamId: ward.id, roundId: 'no-such-round', patientCode: 'SM-0301' }))

    expect([wrongCode.status, notMember.status, unknown.status]).toEqual([400, 400, 400])
    expect(wrongCode.body.error.fields).toEqual({ patientCode: expect.stringMatching(/not in the round/) })
    expect(notMember.body.error.fields).toEqual({ roundId: expect.stringMatching(/not one of this round/) })
    expect(unknown.body.error.fields).toEqual({ roundId: expect.stringMatching(/No such/) })
    expect(await ExamModel.count()).toBe(0)
  })

  it('refuses a closed round, and an entry of a closed round keeps its round and code on PATCH', async () => {
    const { ward, educator, examiners } = await calibrationWard(2)
    const round = await openRound(app, educator, ['SM-0301', 'SM-0302'], examiners)
    const draft = await recordExam(app, examiners[0]!.auth, { teamId: ward.id, roundId: round.id, patientCode: 'SM-0301' })
    await closeRoundAs(app, educator.auth, round.id)

    const late = await createAs(examiners[1]!.auth, makeExamInput({ teamId: ward.id, roundId: round.id, patientCode: 'SM-0301' }))
    const leave = await request(app).patch(`/api/exams/${draft.id}`).set('Authorization', examiners[0]!.auth).send({ roundId: null, baseVersion: 1 })
    const recode = await request(app).patch(`/api/exams/${draft.id}`).set('Authorization', examiners[0]!.auth).send({ patientCode: 'SM-0302', baseVersion: 1 })
    const notes = await request(app).patch(`/api/exams/${draft.id}`).set('Authorization', examiners[0]!.auth).send({ notes: 'Re-read at 45°', baseVersion: 1 })

    expect(late.status).toBe(400)
    expect(late.body.error.fields.roundId).toMatch(/closed/)
    expect(leave.status).toBe(400)
    expect(leave.body.error.fields.roundId).toMatch(/closed/)
    expect(recode.status).toBe(400)
    expect(recode.body.error.fields.patientCode).toMatch(/closed/)
    expect(notes.status).toBe(200)
    expect(notes.body.roundId).toBe(round.id)
  })

  it('a PATCH may move a draft into an open round only with one of its codes', async () => {
    const { ward, educator, examiners } = await calibrationWard(2)
    const round = await openRound(app, educator, ['SM-0301'], examiners)
    const plain = await recordExam(app, examiners[0]!.auth, { teamId: ward.id, patientCode: 'SM-0142' })

    const wrong = await request(app).patch(`/api/exams/${plain.id}`).set('Authorization', examiners[0]!.auth).send({ roundId: round.id, baseVersion: 1 })
    const right = await request(app)
      .patch(`/api/exams/${plain.id}`)
      .set('Authorization', examiners[0]!.auth)
      .send({ roundId: round.id, patientCode: 'SM-0301', baseVersion: 1 })

    expect(wrong.status).toBe(400)
    expect(wrong.body.error.fields.patientCode).toMatch(/not in the round/)
    expect(right.status).toBe(200)
    expect(right.body.roundId).toBe(round.id)
  })

  it('a sync push applies a valid entry and rejects an invalid one with its field errors, item by item', async () => {
    const { ward, educator, examiners } = await calibrationWard(2)
    const round = await openRound(app, educator, ['SM-0301'], examiners)
    const good = newExam(ward.id, { roundId: round.id, patientCode: 'SM-0301' })
    const bad = newExam(ward.id, { roundId: round.id, patientCode: 'SM-0400' })

    const res = await push(app, examiners[0]!.auth, [good, bad])

    expect(res.status).toBe(200)
    expect(res.body.results[0].result).toBe('applied')
    expect(res.body.results[1]).toMatchObject({ result: 'rejected', error: { fields: { patientCode: expect.stringMatching(/not in the round/) } } })
    expect((await ExamModel.findByPk(good.exam.id as string))?.roundId).toBe(round.id)
  })

  it('a replayed push of an entry is a duplicate, not a conflict', async () => {
    const { ward, educator, examiners } = await calibrationWard(2)
    const round = await openRound(app, educator, ['SM-0301'], examiners)
    const change = newExam(ward.id, { roundId: round.id, patientCode: 'SM-0301' })

    await push(app, examiners[0]!.auth, [change])
    const again = await push(app, examiners[0]!.auth, [change])

    expect(again.body.results[0].result).toBe('duplicate')
  })
})
