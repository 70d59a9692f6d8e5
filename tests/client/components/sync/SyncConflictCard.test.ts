import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import { ExamInputSchema } from '#shared/schemas/exam'
import type { Conflict } from '@/db/conflicts'
import SyncConflictCard from '@/components/sync/SyncConflictCard.vue'
import { makeExam } from '../exam/make-exam'

function conflictOn(theirs: Parameters<typeof makeExam>[0], mine: Record<string, unknown>): Conflict {
  const server = makeExam(theirs)
  return { seq: 7, theirs: server, mine: ExamInputSchema.parse({ ...server, ...mine }) }
}

function mountCard(conflict: Conflict) {
  return mount(SyncConflictCard, { props: { conflict, busy: false }, global: { plugins: [createVuetify()] } })
}

describe('SyncConflictCard', () => {
  it('shows, side by side, only the fields on which this device and the server differ', () => {
    const wrapper = mountCard(conflictOn({ heightCm: 2, notes: 'Re-measured upright' }, { heightCm: 4, notes: '' }))

    const rows = wrapper.findAll('[data-testid^="diff-"]').map((row) => row.findAll('th, td').map((cell) => cell.text()))

    expect(rows).toEqual([
      ['Height above the sternal angle (cm)', '4', '2'],
      ['Notes', '—', 'Re-measured upright'],
    ])
  })

  it('offers both choices on a draft and says which one the user picked', async () => {
    const wrapper = mountCard(conflictOn({ heightCm: 2 }, { heightCm: 4 }))

    await wrapper.find('[data-testid="keep-mine"]').trigger('click')
    await wrapper.find('[data-testid="take-server"]').trigger('click')

    expect(wrapper.emitted()).toHaveProperty('keep-mine')
    expect(wrapper.emitted()).toHaveProperty('take-server')
  })

  it('refuses "keep mine" over a countersigned record and says why', () => {
    const wrapper = mountCard(conflictOn({ heightCm: 2, status: 'countersigned' }, { heightCm: 4 }))

    expect(wrapper.find('[data-testid="keep-mine"]').attributes('disabled')).toBeDefined()
    expect(wrapper.find('[data-testid="take-server"]').attributes('disabled')).toBeUndefined()
    expect(wrapper.find('[data-testid="conflict-locked"]').text()).toContain('A signed record is never overwritten')
  })
})
