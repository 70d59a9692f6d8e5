import type { AddressInfo } from 'node:net'
import express from 'express'
import { ExamInputSchema, type ExamInput, type ExamInputRaw } from '#shared/schemas/exam'
import type { User } from '#shared/schemas/user'
import { getUser } from '../../../server/users/users.service.ts'
import { makeExamInput } from '../../server/factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../../server/helpers.ts'
import { configureApiBase } from '@/api/client'
import { queueSave } from '@/db/outbox'
import { estimateBasisInUse } from '@/stores/settings'
import { makeDraft } from '../factories/draft'

/** Faults the next pushes meet before they reach the real API. */
export interface PushFaults {
  /** How many pushes answer 500 before one gets through. */
  failures: number
  /** Holds the next push this long before the API sees it; the client gives up first, the server still applies it. */
  stallMs: number
  /** Runs when a push arrives, before the API answers it. */
  onArrival?: () => Promise<void>
}

/** The real API on in-memory SQLite, listening on a loopback port, with the client's `api` pointed at it. */
export async function startSyncServer() {
  const { app, sequelize } = await makeTestApp()
  const faults: PushFaults = { failures: 0, stallMs: 0 }
  const front = express()
  // Read before any stall, so the API still gets the body after the client has given up on the request.
  front.use('/api/sync/push', express.json({ limit: '256kb' }), async (_req, res, next) => {
    await faults.onArrival?.()
    if (faults.failures > 0) {
      faults.failures -= 1
      return void res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server' } })
    }
    if (!faults.stallMs) return next()
    setTimeout(next, faults.stallMs)
    faults.stallMs = 0
  })
  front.use(app)
  const server = front.listen(0, '127.0.0.1')
  await new Promise<void>((resolve) => server.once('listening', () => resolve()))
  const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/`
  /** How long the client waits for an answer before giving up on a request. */
  const clientTimeout = (ms: number) => configureApiBase(base, { timeout: ms })
  clientTimeout(10_000)
  const close = async () => {
    server.closeAllConnections()
    await new Promise((resolve) => server.close(resolve))
    await sequelize.close()
  }
  return { base, faults, clientTimeout, close }
}

/** A resident on a team of their own, as the client's session holds them, with a valid access token. */
export async function makeAccount(): Promise<{ user: User; token: string }> {
  const team = await makeTeam()
  const caller = await makeCaller({ teamIds: [team.id] })
  return { user: (await getUser(caller.user.id))!, token: caller.auth.slice('Bearer '.length) }
}

/** Saves an exam on this device for the user, as the bedside flow does: local copy, outbox change and draft together. */
export async function saveOffline(user: User, overrides: Partial<ExamInputRaw> = {}): Promise<ExamInput> {
  const input = ExamInputSchema.parse(makeExamInput({ teamId: user.teams[0]!.id, ...overrides }))
  await queueSave(makeDraft({}, { id: input.id }), input, user, estimateBasisInUse())
  return input
}
