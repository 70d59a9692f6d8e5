import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { computeEstimate } from '#shared/domain/estimate'
import {
  AWaveSchema,
  CautionCodeSchema,
  ColumnTopSchema,
  ContextFlagSchema,
  CvpCategorySchema,
  EstimateSchema,
  ExamFindingsSchema,
  HeightMethodSchema,
  NotAssessableReasonSchema,
  OffsetModelSchema,
  ReadingPrecisionSchema,
  RespiratorySchema,
  RhythmSchema,
  VeinSchema,
  VenousSignSchema,
  VenousSignStateSchema,
  VWaveSchema,
  YDescentSchema,
  type ObserverTerm,
} from '#shared/schemas/exam'
import { DEFAULT_ESTIMATE_SETTINGS as defaults } from '#shared/schemas/settings'
import { makeFindings } from '../factories.ts'

const oneOf = <T extends string>(schema: { options: readonly T[] }) => fc.constantFrom(...schema.options)
const real = (min: number, max: number) => fc.double({ min, max, noNaN: true })
const signs = VenousSignSchema.options

/** Any findings the schema accepts, within the ranges of the exam record; combinations it refuses are dropped. */
const anyFindings = fc
  .record({
    inclinationDeg: real(0, 90),
    vein: oneOf(VeinSchema),
    columnTop: oneOf(ColumnTopSchema),
    heightMethod: oneOf(HeightMethodSchema),
    heightCm: real(-10, 30),
    alongNeckCm: real(0, 40),
    readingPrecision: oneOf(ReadingPrecisionSchema),
    offsetModel: oneOf(OffsetModelSchema),
    venousSigns: fc.array(oneOf(VenousSignStateSchema), { minLength: 6, maxLength: 6 }).map((s) => Object.fromEntries(signs.map((sign, i) => [sign, s[i]]))),
    venousConfirmed: fc.boolean(),
    rhythm: oneOf(RhythmSchema),
    waveform: fc.record({ aWave: oneOf(AWaveSchema), vWave: oneOf(VWaveSchema), yDescent: oneOf(YDescentSchema) }),
    respiratory: oneOf(RespiratorySchema),
    abdominojugular: fc.record({ done: fc.boolean(), riseCm: real(0, 30), sustained: fc.boolean(), fallOnReleaseCm: real(0, 30) }),
    notAssessableReason: oneOf(NotAssessableReasonSchema),
    notAssessableText: fc.constant('cervical collar'),
    context: fc.subarray([...ContextFlagSchema.options]),
  })
  .map((input) => ExamFindingsSchema.safeParse(input))
  .filter((result) => result.success)
  .map((result) => result.data!)

const localTerm: fc.Arbitrary<ObserverTerm> = fc.record({
  source: fc.constantFrom('local-pairs' as const, 'local-rounds' as const),
  sigmaCm: real(1, 10),
  n: fc.integer({ min: 30, max: 2000 }),
  ci: fc.constant<[number, number]>([1, 12]),
})
const anyObserver = fc.option(localTerm, { nil: undefined })

const ORDER = CvpCategorySchema.options
const CAUTION_ORDER = CautionCodeSchema.options

describe('computeEstimate, for every valid input', () => {
  it('returns finite numbers (or null where there is no estimate) in the shape of the API', () => {
    fc.assert(
      fc.property(anyFindings, anyObserver, (findings, observer) => {
        const estimate = computeEstimate(findings, { observer })

        const numbers = [estimate.cvpCmH2O, estimate.cvpMmHg, estimate.sigmaCm, estimate.offsetCm, ...(estimate.bandCmH2O ?? []), ...(estimate.bandMmHg ?? [])]
        expect(numbers.every((n) => n === null || Number.isFinite(n))).toBe(true)
        expect(EstimateSchema.safeParse(estimate).success).toBe(true)
      }),
    )
  })

  it('keeps the estimate inside its own band, in both units', () => {
    fc.assert(
      fc.property(anyFindings, anyObserver, (findings, observer) => {
        const estimate = computeEstimate(findings, { observer })

        if (estimate.cvpCmH2O === null) return
        const [low, high] = estimate.bandCmH2O!
        const [lowMmHg, highMmHg] = estimate.bandMmHg!
        expect(low ?? -Infinity).toBeLessThan(estimate.cvpCmH2O)
        expect(high ?? Infinity).toBeGreaterThan(estimate.cvpCmH2O)
        expect(lowMmHg ?? -Infinity).toBeLessThan(estimate.cvpMmHg!)
        expect(highMmHg ?? Infinity).toBeGreaterThan(estimate.cvpMmHg!)
      }),
    )
  })

  it('reports categories as a run of neighbours, low to high, with confidence clear exactly when there is one', () => {
    fc.assert(
      fc.property(anyFindings, anyObserver, (findings, observer) => {
        const estimate = computeEstimate(findings, { observer })

        const indexes = estimate.categories.map((c) => ORDER.indexOf(c))
        expect(indexes).toEqual(indexes.length ? Array.from({ length: indexes.length }, (_, i) => indexes[0]! + i) : [])
        expect(estimate.categories.length === 0).toBe(estimate.bound === 'none')
        expect(estimate.confidence).toBe(indexes.length === 0 ? null : indexes.length === 1 ? 'clear' : 'indeterminate')
      }),
    )
  })

  it('puts arterial evidence first whenever there is any, and each caution once in a fixed order', () => {
    fc.assert(
      fc.property(anyFindings, (findings) => {
        const codes = computeEstimate(findings).cautions.map((c) => c.code)

        expect(codes[0] === 'arterial-evidence').toBe(findings.venousSigns['not-palpable'] === 'absent' || findings.venousSigns['obliterated-by-light-pressure'] === 'absent')
        expect(new Set(codes).size).toBe(codes.length)
        const measurement = codes.filter((c) => !(ContextFlagSchema.options as readonly string[]).includes(c)).map((c) => CAUTION_ORDER.indexOf(c))
        expect(measurement).toEqual([...measurement].sort((a, b) => a - b))
      }),
    )
  })

  it('explains the frame exactly when a point estimate is elevated at or below the high threshold, or not elevated above it', () => {
    fc.assert(
      fc.property(anyFindings, (findings) => {
        const estimate = computeEstimate(findings)

        const noted = estimate.cautions.some((c) => c.code === 'frame-disagreement')
        const disagree = estimate.bound === 'point' && estimate.elevated !== estimate.cvpCmH2O! > defaults.highAboveCmH2O
        expect(noted).toBe(disagree)
      }),
    )
  })

  it('gives the 5 cm convention the same σ as the incline-adjusted offset', () => {
    fc.assert(
      fc.property(anyFindings, anyObserver, (findings, observer) => {
        const fixed = computeEstimate({ ...findings, offsetModel: 'fixed-5cm' }, { observer })

        const adjusted = computeEstimate({ ...findings, offsetModel: 'incline-adjusted' }, { observer })

        expect(fixed.sigmaCm).toBe(adjusted.sigmaCm)
      }),
    )
  })

  it('gives mmHg × 1.35951 ≈ cmH₂O', () => {
    fc.assert(
      fc.property(anyFindings, (findings) => {
        const estimate = computeEstimate(findings)

        // NIST SP 811 App. B.8: 1 mmHg = 1.35951 cmH₂O
        if (estimate.cvpCmH2O === null) return
        expect(estimate.cvpMmHg! * 1.35951).toBeCloseTo(estimate.cvpCmH2O, 4)
      }),
    )
  })

  it('rises strictly with the vertical height at a fixed inclination and model', () => {
    const millimetres = fc.integer({ min: -100, max: 300 })
    fc.assert(
      fc.property(real(0, 90), oneOf(OffsetModelSchema), millimetres, millimetres, (inclinationDeg, offsetModel, a, b) => {
        fc.pre(a !== b)
        const [lower, higher] = [Math.min(a, b) / 10, Math.max(a, b) / 10]

        const low = computeEstimate(makeFindings({ inclinationDeg, offsetModel, heightCm: lower }))
        const high = computeEstimate(makeFindings({ inclinationDeg, offsetModel, heightCm: higher }))

        expect(high.cvpCmH2O!).toBeGreaterThan(low.cvpCmH2O!)
      }),
    )
  })

  it('rises strictly with the distance along the neck at a fixed inclination of 30° or more', () => {
    const millimetres = fc.integer({ min: 0, max: 400 })
    fc.assert(
      fc.property(fc.integer({ min: 30, max: 90 }), millimetres, millimetres, (inclinationDeg, a, b) => {
        fc.pre(a !== b)
        const along = (mm: number) => makeFindings({ inclinationDeg, heightMethod: 'along-neck', alongNeckCm: mm / 10, heightCm: null })

        const low = computeEstimate(along(Math.min(a, b)))
        const high = computeEstimate(along(Math.max(a, b)))

        expect(high.cvpCmH2O!).toBeGreaterThan(low.cvpCmH2O!)
      }),
    )
  })
})
