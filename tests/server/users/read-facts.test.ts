// The read facts come with the account in one statement (server/users/auth-state.ts) and replace the scope's and the
// answer key's own queries on cached reads: these tests hold them equal to what those queries answer.
import { beforeEach, describe, expect, it } from 'vitest'
import { scopeOf } from '../../../server/exams/exam-access.ts'
import { examDataVersion } from '../../../server/exams/exam-caches.ts'
import { MembershipModel } from '../../../server/models/index.ts'
import { getAuthState } from '../../../server/users/auth-state.ts'
import { membersOf } from '../../../server/users/team-members.ts'
import { recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { calibrationWard, closeRoundAs, openRound, recordEntry } from '../rounds/round-setup.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

/** The scope built from the statement's facts and the scope built by its own queries, for one account. */
async function bothScopes(userId: string) {
  const state = await getAuthState(userId)
  if (!state) throw new Error('no such account')
  return { facts: state.facts, withFacts: await scopeOf(state.user, state.facts), queried: await scopeOf(state.user) }
}

describe('read facts read with the account', () => {
  it('give the same scope as its own queries, for an attending of two teams, examiners of an open and a closed round, an educator', async () => {
    const setup = await calibrationWard(2, true)
    const [resident, attending] = setup.examiners as [(typeof setup.examiners)[0], (typeof setup.examiners)[0]]
    const other = await makeTeam('Ward 2 South')
    const colleague = await makeCaller({ teamIds: [other.id] })
    await MembershipModel.create({ userId: attending.user.id, teamId: other.id })
    const closed = await openRound(app, setup.educator, ['SM-0401'], [resident, attending], 'Closed round')
    await recordEntry(app, resident, setup.ward.id, closed.id, 'SM-0401', 3)
    expect((await closeRoundAs(app, setup.educator.auth, closed.id)).status).toBe(200)
    const open = await openRound(app, setup.educator, ['SM-0402'], [attending, resident], 'Open round')

    for (const caller of [resident, attending, setup.educator, colleague]) {
      const { facts, withFacts, queried } = await bothScopes(caller.user.id)
      expect(withFacts.key).toBe(queried.key)
      expect(facts.openRounds).toEqual([open.id])
    }
    const { facts } = await bothScopes(attending.user.id)
    expect(facts.teammates).toEqual(await membersOf([setup.ward.id, other.id]))
    expect(facts.teammates).toContain(colleague.user.id)
    expect((await bothScopes(resident.user.id)).facts.closedRoundsExamined).toEqual(new Set([closed.id]))
    expect((await bothScopes(colleague.user.id)).facts.closedRoundsExamined).toEqual(new Set())
  })

  it('carry the data version the answer cache reads alone, and it moves with an exam write', async () => {
    const ward = await makeTeam()
    const resident = await makeCaller({ teamIds: [ward.id] })
    const before = (await getAuthState(resident.user.id))!.facts.dataVersion

    await recordSubmittedExam(app, resident.auth, { teamId: ward.id })
    const after = (await getAuthState(resident.user.id))!.facts.dataVersion

    expect(after).toEqual(await examDataVersion())
    expect(after.exams).not.toBe(before.exams)
  })
})
