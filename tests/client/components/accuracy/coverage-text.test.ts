import { describe, expect, it } from 'vitest'
import { coverageSentence, coverageVerdict } from '@/components/accuracy/coverage-text'

// Wilson score intervals (Wilson 1927, JASA 22:209–212), by hand with z = 1.96:
// 41/50 → 0.692–0.902; 48/50 → 0.865–0.989; 100/100 → 100/103.84 = 0.963–1.
describe('coverage in words', () => {
  it('when the whole interval lies below 95%, says the band is narrower than it should be', () => {
    const sentence = coverageSentence({ inside: 41, n: 50, share: 0.82, ci: [0.692, 0.902] })

    expect(sentence).toContain('The band held the measured value in 41 of 50 exams: narrower than it should be')
    expect(sentence).toContain('82%, 95% CI 69% to 90%')
  })

  it('when 95% lies inside the interval, says the band is consistent with an honest 95% band', () => {
    expect(coverageSentence({ inside: 48, n: 50, share: 0.96, ci: [0.865, 0.989] })).toContain('48 of 50 exams: consistent with an honest 95% band')
  })

  it('when the whole interval lies above 95%, says the band is wider than it needs to be', () => {
    expect(coverageSentence({ inside: 100, n: 100, share: 1, ci: [0.963, 1] })).toContain('wider than it needs to be')
  })

  it('counts an interval that ends exactly at 95% as consistent', () => {
    expect(coverageVerdict([0.9, 0.95])).toBe('honest')
    expect(coverageVerdict([0.95, 0.99])).toBe('honest')
  })

  it('without pairs, says coverage cannot be judged yet', () => {
    expect(coverageSentence({ inside: 0, n: 0, share: null, ci: null })).toContain('cannot be judged')
  })
})
