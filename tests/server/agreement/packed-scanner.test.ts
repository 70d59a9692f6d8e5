import { describe, expect, it } from 'vitest'
import { PackedScanner } from '../../../server/agreement/packed-scanner.ts'

const packed = (...records: string[][]) => records.map((fields) => fields.join('\x1f')).join('\x1e')

describe('PackedScanner', () => {
  it('reads numbers exactly as Number() would, in every form SQLite writes them', () => {
    const numbers = ['0', '12', '-10', '-0.5', '13.7', '2.12132034355964', '12.200000000000001', '1.0e-05', '-3.5e-07', '1767225600000']
    const scan = new PackedScanner(packed(numbers))

    const read = numbers.map(() => scan.number())

    expect(read).toEqual(numbers.map(Number))
    expect(scan.done).toBe(true)
  })

  it('reads text fields and moves from record to record', () => {
    const scan = new PackedScanner(packed(['SM-0142', '4.5'], ['SM-0157', '-1']))

    const read = [scan.text(), scan.number(), scan.text(), scan.number()]

    expect(read).toEqual(['SM-0142', 4.5, 'SM-0157', -1])
    expect(scan.done).toBe(true)
  })
})
