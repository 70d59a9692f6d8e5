import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import KappaTables from '@/components/agreement/KappaTables.vue'
import { UNAVAILABLE } from './make-agreement'

const mountKappa = (props: InstanceType<typeof KappaTables>['$props']) =>
  mount(KappaTables, { props, global: { plugins: [createVuetify()] } })

describe('KappaTables', () => {
  it('shows Cohen’s kappa for elevated and both weighted kappas for the category, with the Landis & Koch labels', () => {
    const wrapper = mountKappa({
      kappaElevated: { value: 0.4, label: 'moderate' },
      kappaCategory: { linear: 0.4701, quadratic: 0.5765, label: 'moderate' },
    })

    const elevated = wrapper.find('[data-testid="kappa-elevated"]').text()
    const category = wrapper.find('[data-testid="kappa-category"]').text()
    expect(elevated).toContain("Cohen's kappa")
    expect(elevated).toContain('0.40')
    expect(elevated).toContain('moderate')
    expect(category).toContain('Weighted kappa, linear0.47moderate')
    expect(category).toContain('Weighted kappa, quadratic0.58')
  })

  it('prints a negative kappa with its sign and the label poor', () => {
    const wrapper = mountKappa({ kappaElevated: { value: -0.125, label: 'poor' }, kappaCategory: UNAVAILABLE })

    expect(wrapper.find('[data-testid="kappa-elevated"]').text()).toContain('−0.13')
    expect(wrapper.find('[data-testid="kappa-elevated"]').text()).toContain('poor')
  })

  it('states the reason for an unavailable kappa, never NaN', () => {
    const wrapper = mountKappa({
      kappaElevated: { unavailable: 'All ratings fall in a single category, so kappa is undefined' },
      kappaCategory: UNAVAILABLE,
    })

    expect(wrapper.find('[data-testid="kappa-elevated-reason"]').text()).toContain('All ratings fall in a single category')
    expect(wrapper.find('[data-testid="kappa-category-reason"]').text()).toContain('Needs at least 2 pairs; only 1 matches')
    expect(wrapper.text()).not.toContain('NaN')
  })
})
