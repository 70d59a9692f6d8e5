import { describe, expect, it } from 'vitest'
import { orient, pairReadings, type Reading } from '../../../server/agreement/pairs.ts'

const MINUTE = 60_000
let examNumber = 0
const reading = (examinerId: string, minutes: number, patient = 0): Reading => ({
  examId: `exam-${++examNumber}`,
  patientCode: `SM-${patient}`,
  examinerId,
  teamId: 'ward',
  at: minutes * MINUTE,
  heightCm: 4,
  cvpCmH2O: 13.7,
  inclinationDeg: 45,
  vein: 'right-internal',
  columnTop: 'seen',
})
const WINDOW = 120
const examiners = (pairs: ReturnType<typeof pairReadings>) => pairs.map((p) => [p.earlier.examinerId, p.later.examinerId])
const isAttending = (id: string) => id.startsWith('attending')

describe('pairReadings', () => {
  it('pairs the two nearest in time first and each reading at most once', () => {
    const readings = [reading('resident-a', 0), reading('resident-b', 50), reading('attending', 60), reading('resident-c', 115)]

    const pairs = pairReadings(readings, WINDOW)

    expect(examiners(pairs)).toEqual([['resident-b', 'attending'], ['resident-a', 'resident-c']])
  })

  it('skips a nearer partner by the same examiner for the nearest different one', () => {
    const readings = [reading('resident-a', 0), reading('resident-a', 10), reading('attending', 20)]

    const pairs = pairReadings(readings, WINDOW)

    expect(examiners(pairs)).toEqual([['resident-a', 'attending']])
    expect(pairs[0]!.earlier).toBe(readings[1])
  })

  it('on equal gaps pairs the earlier readings first', () => {
    const readings = [reading('resident-a', 0), reading('attending', 30), reading('resident-b', 60)]

    const pairs = pairReadings(readings, WINDOW)

    expect(examiners(pairs)).toEqual([['resident-a', 'attending']])
  })

  it('sorts readings that arrive out of order before pairing', () => {
    const readings = [reading('attending', 30, 1), reading('resident-a', 0, 1), reading('resident-b', 500, 0), reading('attending', 530, 0)]

    const pairs = pairReadings(readings, WINDOW)

    expect(examiners(pairs)).toEqual([['resident-b', 'attending'], ['resident-a', 'attending']])
  })

  it('never pairs readings of different patients', () => {
    const readings = [reading('resident-a', 0, 0), reading('attending', 10, 1)]

    expect(pairReadings(readings, WINDOW)).toEqual([])
  })

  it('pairs readings exactly the window apart, not a minute more', () => {
    const inside = [reading('resident-a', 0, 0), reading('attending', 90, 0)]
    const outside = [reading('resident-a', 0, 1), reading('attending', 91, 1)]

    expect(pairReadings(inside, 90)).toHaveLength(1)
    expect(pairReadings(outside, 90)).toEqual([])
  })
})

describe('orient', () => {
  it('takes resident − attending when exactly one examiner is an attending, whoever came first', () => {
    const [earlier, later] = [reading('attending', 0), reading('resident-a', 30)]

    const pair = orient({ earlier, later }, isAttending)

    expect(pair).toEqual({ first: later, second: earlier, order: 'resident-minus-attending' })
  })

  it('takes earlier − later otherwise', () => {
    const [earlier, later] = [reading('resident-a', 0), reading('resident-b', 30)]

    const pair = orient({ earlier, later }, isAttending)

    expect(pair).toEqual({ first: earlier, second: later, order: 'earlier-minus-later' })
  })
})
