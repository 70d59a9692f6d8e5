import { describe, expect, it } from 'vitest'
import { pairReadings, type Reading } from '../../../server/agreement/pairs.ts'

const MINUTE = 60_000
let rowid = 0
const reading = (examinerId: string, minutes: number, patient = 0): Reading => ({
  patient,
  patientCode: `SM-${patient}`,
  rowid: ++rowid,
  examinerId,
  teamId: 'ward',
  at: minutes * MINUTE,
  heightCm: 4,
  cvpCmH2O: 13.7,
  inclinationDeg: 45,
  vein: 'right-internal',
})
const options = { windowMinutes: 120, isAttending: (id: string) => id.startsWith('attending') }
const examiners = (pairs: ReturnType<typeof pairReadings>) => pairs.map((p) => [p.first.examinerId, p.second.examinerId])

describe('pairReadings', () => {
  it('pairs the two nearest in time first and each reading at most once', () => {
    const readings = [reading('resident-a', 0), reading('resident-b', 50), reading('attending', 60), reading('resident-c', 115)]

    const pairs = pairReadings(readings, options)

    expect(examiners(pairs)).toEqual([['resident-b', 'attending'], ['resident-a', 'resident-c']])
  })

  it('skips a nearer partner by the same examiner for the nearest different one', () => {
    const readings = [reading('resident-a', 0), reading('resident-a', 10), reading('attending', 20)]

    const pairs = pairReadings(readings, options)

    expect(examiners(pairs)).toEqual([['resident-a', 'attending']])
    expect(pairs[0]!.first).toBe(readings[1])
  })

  it('on equal gaps pairs the earlier readings first', () => {
    const readings = [reading('resident-a', 0), reading('attending', 30), reading('resident-b', 60)]

    const pairs = pairReadings(readings, options)

    expect(examiners(pairs)).toEqual([['resident-a', 'attending']])
  })

  it('sorts readings that arrive out of order before pairing', () => {
    const readings = [reading('attending', 30, 1), reading('resident-a', 0, 1), reading('resident-b', 500, 0), reading('attending', 530, 0)]

    const pairs = pairReadings(readings, options)

    expect(examiners(pairs)).toEqual([['resident-b', 'attending'], ['resident-a', 'attending']])
  })

  it('never pairs readings of different patients', () => {
    const readings = [reading('resident-a', 0, 0), reading('attending', 10, 1)]

    expect(pairReadings(readings, options)).toEqual([])
  })
})
