import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import BedsideHeightDiagram from '@/components/bedside/BedsideHeightDiagram.vue'

function mountDiagram(inclinationDeg: number | null, heightCm: number | null = 4) {
  return mount(BedsideHeightDiagram, { props: { inclinationDeg, heightCm, method: 'vertical' }, global: { plugins: [createVuetify()] } })
}

function lineAngleDeg(wrapper: ReturnType<typeof mountDiagram>, testid: string) {
  const line = wrapper.find(`[data-testid="${testid}"]`)
  const [x1, y1, x2, y2] = ['x1', 'y1', 'x2', 'y2'].map((name) => Number(line.attributes(name)))
  // SVG y grows downwards, so rising lines have y2 < y1.
  return (Math.atan2(y1! - y2!, x2! - x1!) * 180) / Math.PI
}

describe('BedsideHeightDiagram', () => {
  it.each([0, 30, 45, 60, 90])('draws the trunk at the entered inclination of %i°', (inclination) => {
    const wrapper = mountDiagram(inclination)

    expect(lineAngleDeg(wrapper, 'diagram-trunk')).toBeCloseTo(inclination, 6)
  })

  it('redraws the trunk when the inclination changes', async () => {
    const wrapper = mountDiagram(30)

    await wrapper.setProps({ inclinationDeg: 60 })

    expect(lineAngleDeg(wrapper, 'diagram-trunk')).toBeCloseTo(60, 6)
  })

  it('holds the rule vertical on the sternal angle and the straight edge level at the column top', () => {
    const wrapper = mountDiagram(45, 4)

    const sternal = wrapper.find('[data-testid="diagram-sternal-angle"]')
    const columnTop = wrapper.find('[data-testid="diagram-column-top"]')
    expect(lineAngleDeg(wrapper, 'diagram-rule')).toBeCloseTo(90, 6)
    expect(lineAngleDeg(wrapper, 'diagram-edge')).toBeCloseTo(0, 6)
    expect(wrapper.find('[data-testid="diagram-rule"]').attributes('x1')).toBe(sternal.attributes('cx'))
    expect(wrapper.find('[data-testid="diagram-edge"]').attributes('y1')).toBe(columnTop.attributes('cy'))
  })

  it('puts the column top higher for a greater height', async () => {
    const wrapper = mountDiagram(45, 2)
    const low = Number(wrapper.find('[data-testid="diagram-column-top"]').attributes('cy'))

    await wrapper.setProps({ heightCm: 6 })

    expect(Number(wrapper.find('[data-testid="diagram-column-top"]').attributes('cy'))).toBeLessThan(low)
  })
})
