import { afterEach, describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import { Line } from 'vue-chartjs'
import type { ChartData } from 'chart.js'
import AgreementTrendChart from '@/components/agreement/AgreementTrendChart.vue'
import { makeTrend } from './make-agreement'

const mountTrend = (months = makeTrend().months) =>
  mount(AgreementTrendChart, { props: { months }, global: { plugins: [createVuetify()] }, attachTo: document.body })

afterEach(() => {
  document.body.innerHTML = ''
})

describe('AgreementTrendChart', () => {
  it('draws the bias and limits per month, leaving gaps where a month has none', () => {
    const wrapper = mountTrend()

    const data = wrapper.findComponent(Line).props('data') as ChartData<'line'>
    expect(data.labels).toEqual(['Jan 2026', 'Feb 2026', 'Mar 2026'])
    const byLabel = Object.fromEntries(data.datasets.map((d) => [d.label, d.data]))
    expect(byLabel['Bias']).toEqual([-1.5, null, 0.5])
    expect(byLabel['Upper limit of agreement']).toEqual([-0.114, null, null])
    expect(byLabel['Lower limit of agreement']).toEqual([-2.886, null, null])
  })

  it('reads out every month in its caption, saying which have no pairs or too few for limits', () => {
    const wrapper = mountTrend()

    const caption = wrapper.find('[data-testid="agreement-trend-caption"]').text()
    expect(caption).toContain('Jan 2026: 2 pairs, bias −1.5, limits −2.9 to −0.1')
    expect(caption).toContain('Feb 2026: no pairs')
    expect(caption).toContain('Mar 2026: 1 pair, bias +0.5, limits need at least 2 pairs')
    expect(caption).not.toMatch(/NaN|null/)
  })

  it('says so when no month has pairs', () => {
    expect(mountTrend([]).find('figcaption').text()).toBe('Bias by month: no pairs match the filters.')
  })
})
