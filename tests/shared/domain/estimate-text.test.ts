import { describe, expect, it } from 'vitest'
import { computeEstimate } from '#shared/domain/estimate'
import { categoryStatement, elevatedStatement, observerStatement, promptStatement } from '#shared/domain/estimate-text'
import { StoredEstimateSchema } from '#shared/schemas/exam'
import { EstimateSettingsSchema } from '#shared/schemas/settings'
import { makeFindings, makeLocalTerm } from '../factories.ts'

describe('categoryStatement', () => {
  it.each<[string[], string | null]>([
    [['high'], 'high'],
    [['normal', 'high'], 'normal or high'],
    [['low', 'normal', 'high'], 'low, normal or high'],
    [[], null],
  ])('words %j as %j', (categories, statement) => {
    expect(categoryStatement({ categories: categories as ('low' | 'normal' | 'high')[] })).toBe(statement)
  })

  it('for the worked example, says "normal or high"', () => {
    expect(categoryStatement(computeEstimate(makeFindings()))).toBe('normal or high')
  })
})

describe('elevatedStatement', () => {
  // McGee 1998 (Am Heart J 136:10–18): elevated when more than 3 cm above the sternal angle.
  it('for 4 cm at 45°, says the JVP is elevated, with the threshold', () => {
    expect(elevatedStatement(computeEstimate(makeFindings({ heightCm: 4 })))).toBe('JVP elevated (more than 3 cm above the sternal angle)')
  })

  it('for 2 cm at 45°, says the JVP is not elevated', () => {
    expect(elevatedStatement(computeEstimate(makeFindings({ heightCm: 2 })))).toBe('JVP not elevated (not more than 3 cm above the sternal angle)')
  })

  it('takes the threshold from the settings the estimate was computed with', () => {
    const settings = EstimateSettingsSchema.parse({ elevatedAboveCm: 4 })

    const statement = elevatedStatement(computeEstimate(makeFindings({ heightCm: 3.5 }), { settings }), settings)

    expect(statement).toBe('JVP not elevated (not more than 4 cm above the sternal angle)')
  })

  it('for no column even lying flat, says not elevated', () => {
    const estimate = computeEstimate(makeFindings({ columnTop: 'not-filled', inclinationDeg: 0, heightCm: null }))

    expect(elevatedStatement(estimate)).toMatch(/^JVP not elevated/)
  })

  it('for a column above the neck whose top is no more than 3 cm up, says it cannot be told', () => {
    const estimate = computeEstimate(makeFindings({ columnTop: 'above-neck', inclinationDeg: 60, heightCm: 2 }))

    expect(elevatedStatement(estimate)).toContain('cannot be told')
  })

  it('without an estimate, says nothing', () => {
    const estimate = computeEstimate(makeFindings({ columnTop: 'not-assessable', notAssessableReason: 'agitated', heightCm: null }))

    expect(elevatedStatement(estimate)).toBeNull()
  })

  it('words a stored first-rules estimate the same way', () => {
    const legacy = StoredEstimateSchema.parse({
      ...{ cvpCmH2O: 13.7, cvpMmHg: 10.08, bandCmH2O: [9.2, 18.2], bandMmHg: [6.8, 13.4], offsetCm: 9.7, offsetModel: 'incline-adjusted' },
      ...{ heightCm: 4, sigmaCm: 2.29, bound: 'point', elevated: true, category: 'high', confidence: 'indeterminate' },
      ...{ observerSource: 'default', outsideStudiedRange: false, venousSignCount: 3, mayBeArterial: false, hints: [], caution: 'x' },
    })

    expect(legacy.rulesVersion).toBe(1)
    expect(elevatedStatement(legacy)).toMatch(/^JVP elevated/)
    expect(categoryStatement(legacy)).toBe('high')
  })
})

describe('observerStatement', () => {
  it('names the default terms', () => {
    expect(observerStatement(computeEstimate(makeFindings()))).toBe('default error terms')
  })

  it('names a local term with its source, n, σ and 95% CI', () => {
    const observer = makeLocalTerm({ source: 'local-rounds', sigmaCm: 1.42, n: 34, ci: [1.12, 1.93] })

    const statement = observerStatement(computeEstimate(makeFindings(), { observer }))

    expect(statement).toBe('local error term from 34 subjects of calibration rounds: σ 1.4 cm (95% CI 1.1–1.9)')
  })
})

describe('promptStatement', () => {
  it('labels a prompt as a prompt from Plumbline, not a finding, with its differential', () => {
    const [prompt] = computeEstimate(makeFindings({ waveform: { aWave: 'cannon' } })).prompts

    const statement = promptStatement(prompt!)

    expect(statement).toMatch(/^Prompt from Plumbline \(not a finding\): Cannon a waves/)
    expect(statement).toContain('consider complete heart block, ventricular tachycardia or junctional rhythm')
  })

  it('carries the query of a contradiction', () => {
    const [prompt] = computeEstimate(makeFindings({ waveform: { aWave: 'absent' }, rhythm: 'sinus' })).prompts

    expect(promptStatement(prompt!)).toContain('Query: The rhythm was recorded as sinus')
  })
})
