import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import BedsidePatientStep from '@/components/bedside/BedsidePatientStep.vue'

function mountStep(errors: Record<string, string> = {}) {
  const teams = [{ id: 't-1', name: 'Cardiology A' }]
  return mount(BedsidePatientStep, {
    props: { fields: { patientCode: 'SM-0142', teamId: 't-1', examinedAt: '2026-03-01T10:30:00.000Z', vein: 'right-internal' }, errors, teams },
    global: { plugins: [createVuetify()] },
  })
}

describe('BedsidePatientStep', () => {
  it('reminds that the patient code is never a name', () => {
    const wrapper = mountStep()

    expect(wrapper.find('[data-testid="patient-code"]').text()).toContain('never a name')
  })

  it('explains that the right internal jugular is preferred and a left-sided vein may read high', () => {
    const wrapper = mountStep()

    expect(wrapper.find('[data-testid="vein-right-internal"]').text()).toContain('Preferred')
    expect(wrapper.find('[data-testid="vein-left-internal"]').text()).toContain('falsely high')
  })

  it('shows field errors under their fields', () => {
    const wrapper = mountStep({ patientCode: 'Use letters, digits and “-” only (never a name)' })

    expect(wrapper.find('[data-testid="patient-code"]').text()).toContain('Use letters, digits')
  })

  it('sends a changed exam time as ISO 8601', async () => {
    const wrapper = mountStep()

    await wrapper.find('[data-testid="examined-at"] input').setValue('2026-03-01T09:15')

    expect(wrapper.emitted('update')).toContainEqual([{ examinedAt: new Date('2026-03-01T09:15').toISOString() }])
  })
})
