import { afterEach, describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import { Scatter } from 'vue-chartjs'
import type { ChartData } from 'chart.js'
import BlandAltmanPlot from '@/components/agreement/BlandAltmanPlot.vue'
import { HAND_PAIRS, makePair, makeSummary, UNAVAILABLE } from './make-agreement'

const mountPlot = (props: InstanceType<typeof BlandAltmanPlot>['$props']) =>
  mount(BlandAltmanPlot, { props, global: { plugins: [createVuetify()] }, attachTo: document.body })

afterEach(() => {
  document.body.innerHTML = ''
})

describe('BlandAltmanPlot', () => {
  it('describes the plot in words: bias with its CI, the limits, and the spread of the differences', () => {
    const pairs = HAND_PAIRS.map(([r, a]) => makePair(r, a))
    const summary = makeSummary()

    const wrapper = mountPlot({ pairs, blandAltman: summary.blandAltman, n: 4 })

    const caption = wrapper.find('[data-testid="bland-altman-caption"]').text()
    // Bias −0.875 and SD 1.0308 of the differences −1, −2, +0.5, −1 (Bland & Altman 1986 formulas, by hand);
    // limits −0.875 ∓ 1.96 × 1.0308 = −2.895 and +1.145.
    expect(caption).toContain('Bland–Altman plot of 4 pairs')
    expect(caption).toContain('resident − attending')
    expect(caption).toContain('Bias −0.9 cm (95% CI −2.5 to +0.8)')
    expect(caption).toContain('95% limits of agreement −2.9 to +1.1 cm')
    expect(caption).toContain('Differences run from −2.0 to 0.5 cm')
    expect(caption).not.toMatch(/NaN|undefined/)
  })

  it('plots each pair at (mean, difference) with the bias and both limits as labelled lines across the points', () => {
    const pairs = HAND_PAIRS.map(([r, a]) => makePair(r, a))
    const summary = makeSummary()

    const wrapper = mountPlot({ pairs, blandAltman: summary.blandAltman, n: 4 })

    const data = wrapper.findComponent(Scatter).props('data') as ChartData<'scatter'>
    const [points, upper, bias, lower] = data.datasets
    expect(points!.data).toEqual([
      { x: 3.5, y: -1 },
      { x: 3, y: -2 },
      { x: 4.75, y: 0.5 },
      { x: 1.5, y: -1 },
    ])
    expect(bias!.label).toBe('Bias (−0.9 cm)')
    // Across the padded x-axis: means 1.5 to 4.75, a tenth of the span 3.25 beyond each.
    expect(bias!.data).toEqual([
      { x: expect.closeTo(1.175, 10), y: -0.875 },
      { x: expect.closeTo(5.075, 10), y: -0.875 },
    ])
    expect(upper!.label).toBe('Upper limit of agreement (+1.1 cm)')
    expect(lower!.label).toBe('Lower limit of agreement (−2.9 cm)')
    expect((lower!.data[0] as { y: number }).y).toBeCloseTo(-0.875 - 1.96 * 1.0307764064, 6)
  })

  it('points the canvas at its caption for screen readers', () => {
    const wrapper = mountPlot({ pairs: [makePair(3, 4), makePair(2, 4)], blandAltman: makeSummary().blandAltman, n: 2 })

    const canvas = wrapper.find('canvas')
    const captionId = wrapper.find('figcaption').attributes('id')
    expect(canvas.attributes('role')).toBe('img')
    expect(canvas.attributes('aria-label')).toBe('Bland–Altman plot of 2 pairs')
    expect(captionId).toBeTruthy()
    expect(canvas.attributes('aria-describedby')).toBe(captionId)
  })

  it('gives the stated reason instead of figures when Bland–Altman is unavailable', () => {
    const wrapper = mountPlot({ pairs: [makePair(3, 4)], blandAltman: UNAVAILABLE, n: 1 })

    const caption = wrapper.find('[data-testid="bland-altman-caption"]').text()
    expect(caption).toContain('Needs at least 2 pairs; only 1 matches')
    expect(caption).not.toMatch(/NaN|Bias/)
  })

  it('says when the plot shows only the newest pairs of many', () => {
    const wrapper = mountPlot({ pairs: [makePair(3, 4), makePair(2, 4)], blandAltman: makeSummary().blandAltman, n: 5000 })

    expect(wrapper.find('figcaption').text()).toContain('The plot shows the newest 2 of 5000 pairs')
  })

  it('leaves room above and below the points and the limits, and draws the limits in a colour apart from the bias', () => {
    const pairs = HAND_PAIRS.map(([r, a]) => makePair(r, a))

    const wrapper = mountPlot({ pairs, blandAltman: makeSummary().blandAltman, n: 4 })

    const scatter = wrapper.findComponent(Scatter)
    const y = (scatter.props('options') as { scales: { y: { suggestedMin: number; suggestedMax: number } } }).scales.y
    const [, upper, bias, lower] = (scatter.props('data') as ChartData<'scatter'>).datasets
    // Outermost: the lower limit −2.895 and the upper +1.145 (differences −2 to +0.5 lie between).
    expect(y.suggestedMin).toBeLessThan(-2.895)
    expect(y.suggestedMax).toBeGreaterThan(1.145)
    expect(upper!.borderColor).toBe(lower!.borderColor)
    expect(upper!.borderColor).not.toBe(bias!.borderColor)
  })
})
