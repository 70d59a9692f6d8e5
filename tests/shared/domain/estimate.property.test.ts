import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { computeEstimate } from '#shared/domain/estimate'
import {
  AWaveSchema,
  ColumnTopSchema,
  EstimateSchema,
  HeightMethodSchema,
  OffsetModelSchema,
  ReadingPrecisionSchema,
  RespiratorySchema,
  RhythmSchema,
  VeinSchema,
  VenousSignSchema,
  VWaveSchema,
  YDescentSchema,
} from '#shared/schemas/exam'
import { makeFindings } from '../factories.ts'

const oneOf = <T extends string>(schema: { options: readonly T[] }) => fc.constantFrom(...schema.options)
const real = (min: number, max: number) => fc.double({ min, max, noNaN: true })

/** Any findings the schema accepts, within the ranges of §3. */
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
    venousSigns: fc.subarray([...VenousSignSchema.options]),
    rhythm: oneOf(RhythmSchema),
    waveform: fc.record({ aWave: oneOf(AWaveSchema), vWave: oneOf(VWaveSchema), yDescent: oneOf(YDescentSchema) }),
    respiratory: oneOf(RespiratorySchema),
    abdominojugular: fc.record({ done: fc.boolean(), riseCm: real(0, 30), sustained: fc.boolean() }),
  })
  .map((input) => makeFindings(input))

const anyObserver = fc.option(fc.record({ sigmaCm: real(0.1, 10), source: fc.constantFrom('default' as const, 'local' as const) }), { nil: undefined })

describe('computeEstimate, for every valid input', () => {
  it('returns finite numbers (or null where there is no estimate) in the shape of §8', () => {
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

  it('rises strictly with the distance along the neck at a fixed inclination above 0°', () => {
    const millimetres = fc.integer({ min: 0, max: 400 })
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 90 }), millimetres, millimetres, (inclinationDeg, a, b) => {
        fc.pre(a !== b)
        const along = (mm: number) => makeFindings({ inclinationDeg, heightMethod: 'along-neck', alongNeckCm: mm / 10, heightCm: null })

        const low = computeEstimate(along(Math.min(a, b)))
        const high = computeEstimate(along(Math.max(a, b)))

        expect(high.cvpCmH2O!).toBeGreaterThan(low.cvpCmH2O!)
      }),
    )
  })
})
