import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import ExaminerBiasTable from '@/components/agreement/ExaminerBiasTable.vue'
import { makeSummary } from './make-agreement'

const mountTable = (examiners = makeSummary().byExaminer) =>
  mount(ExaminerBiasTable, { props: { examiners }, global: { plugins: [createVuetify()] } })

describe('ExaminerBiasTable', () => {
  it('lists each resident with n, bias and limits, marking a negative bias as reading lower', () => {
    const wrapper = mountTable()

    const row = wrapper.find('[data-testid="resident-bias-u-res"]')
    expect(row.text()).toContain('Dr Sam Whitcombe')
    expect(row.findAll('td')[0]!.text()).toBe('4')
    expect(row.find('[data-testid="resident-bias-value"]').text()).toBe('−0.9')
    // −0.875 ∓ 1.96 × 1.0308 (Bland & Altman 1986).
    expect(row.text()).toContain('−2.9 to +1.1')
    expect(row.text()).toContain('Reads lower')
  })

  it('leaves attendings out of the residents’ table', () => {
    const wrapper = mountTable()

    expect(wrapper.find('[data-testid="resident-bias-u-att"]').exists()).toBe(false)
    expect(wrapper.text()).not.toContain('Lindqvist')
  })

  it('shows a single pair’s difference without inventing limits', () => {
    const wrapper = mountTable([{ examinerId: 'u-1', name: 'Dr Ada Moss', role: 'resident', n: 1, bias: 0.5, sd: null, loa: null }])

    const row = wrapper.find('[data-testid="resident-bias-u-1"]')
    expect(row.text()).toContain('+0.5')
    expect(row.text()).toContain('Needs 2 pairs')
    expect(row.text()).toContain('Reads higher')
  })

  it('says so when no resident has a pair', () => {
    expect(mountTable([]).find('[data-testid="resident-bias-empty"]').exists()).toBe(true)
  })
})
