import { beforeEach, describe, expect, it } from 'vitest'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { DAY, MINUTE, pairsAs, storeExam } from './factories.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

const T0 = Date.now() - 20 * DAY

describe('GET /api/agreement/pairs: pages', () => {
  it('walk every pair once, newest first, pairs of the same time by the exam id of their first reading', async () => {
    const team = await makeTeam()
    const [resident, attending] = [await makeCaller({ teamIds: [team.id] }), await makeCaller({ roles: ['attending'], teamIds: [team.id] })]
    const educator = await makeCaller({ roles: ['educator'] })
    const firsts: { at: number; firstExamId: string }[] = []
    // Three pairs at the same time (one with the attending first, so its first reading is the later exam) and two older.
    for (const [i, day, attendingFirst] of [[0, 0, false], [1, 0, true], [2, 0, false], [3, 2, true], [4, 5, false]] as const) {
      const common = { teamId: team.id, patientCode: `SM-${3000 + i}` }
      const at = T0 - day * DAY
      const [earlier, later] = attendingFirst ? [attending, resident] : [resident, attending]
      const first = await storeExam({ ...common, examinerId: earlier.user.id, at })
      const second = await storeExam({ ...common, examinerId: later.user.id, at: at + 30 * MINUTE })
      firsts.push({ at, firstExamId: attendingFirst ? second.id : first.id })
    }

    const pages = [await pairsAs(app, educator.auth, { pageSize: 2, page: 1 }), await pairsAs(app, educator.auth, { pageSize: 2, page: 2 })]
    const last = await pairsAs(app, educator.auth, { pageSize: 2, page: 3 })

    const expected = [...firsts].sort((a, b) => b.at - a.at || (a.firstExamId < b.firstExamId ? -1 : 1)).map((f) => f.firstExamId)
    const walked = [...pages, last].flatMap((p) => p.list!.pairs.map((pair) => pair.first.examId))
    expect(walked).toEqual(expected)
    expect([...pages, last].map((p) => [p.list!.total, p.list!.pairs.length])).toEqual([[5, 2], [5, 2], [5, 1]])
  })
})
