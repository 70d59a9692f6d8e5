import { afterEach, describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import { Scatter } from 'vue-chartjs'
import type { ChartData } from 'chart.js'
import PairScatter from '@/components/agreement/PairScatter.vue'
import { makePair } from './make-agreement'

const mountScatter = (pairs: ReturnType<typeof makePair>[]) =>
  mount(PairScatter, { props: { pairs }, global: { plugins: [createVuetify()] }, attachTo: document.body })

afterEach(() => {
  document.body.innerHTML = ''
})

describe('PairScatter', () => {
  it('plots the resident (y) against the attending (x) with the line of equality over the whole range', () => {
    const wrapper = mountScatter([makePair(3, 4), makePair(-1, 0.5), makePair(6, 5)])

    const data = wrapper.findComponent(Scatter).props('data') as ChartData<'scatter'>
    expect(data.datasets[0]!.data).toEqual([
      { x: 4, y: 3 },
      { x: 0.5, y: -1 },
      { x: 5, y: 6 },
    ])
    expect(data.datasets[1]!.data).toEqual([
      { x: -1, y: -1 },
      { x: 6, y: 6 },
    ])
  })

  it('counts in its caption the points below, above and on the line', () => {
    const wrapper = mountScatter([makePair(3, 4), makePair(2, 4), makePair(5, 4.5), makePair(4, 4)])

    const caption = wrapper.find('[data-testid="pair-scatter-caption"]').text()
    expect(caption).toContain('Scatter of 4 resident–attending pairs')
    expect(caption).toContain('2 points lie below the line (the resident read lower), 1 above it')
    expect(caption).toContain('and 1 on it')
    expect(wrapper.find('canvas').attributes('aria-describedby')).toBe(wrapper.find('figcaption').attributes('id'))
  })

  it('leaves out pairs of two residents or two attendings, which have no resident–attending side', () => {
    const wrapper = mountScatter([makePair(3, 4, { order: 'earlier-minus-later' })])

    expect(wrapper.find('figcaption').text()).toContain('no resident–attending pairs match')
    const data = wrapper.findComponent(Scatter).props('data') as ChartData<'scatter'>
    expect(data.datasets[0]!.data).toEqual([])
  })
})
