import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createVuetify } from 'vuetify'
import RoundEntryPicker from '@/components/rounds/RoundEntryPicker.vue'
import BedsidePatientStep from '@/components/bedside/BedsidePatientStep.vue'
import { parseDraft } from '@/utils/bedside-steps'
import { DraftRowSchema, type DraftFields } from '@/db/draft-schema'
import { useSessionStore } from '@/stores/session'
import * as roundsApi from '@/api/rounds'
import { makeUser } from '../../factories/user'
import { makeDraft, WORKED_EXAMPLE } from '../../factories/draft'
import { makeRound } from '../../views/RoundFixtures'

vi.mock('@/api/rounds')

const OPEN = makeRound({ id: 'r-open', name: 'November round', patientCodes: ['SM-0311', 'SM-0312'] })
const CLOSED = makeRound({ id: 'r-closed', name: 'October round', status: 'closed' })
const ELSEWHERE = makeRound({ id: 'r-other', name: 'Not mine', examiners: [{ id: 'someone', displayName: 'Someone' }, { id: 'else', displayName: 'Else' }] })

function mountPicker(fields: DraftFields) {
  useSessionStore().user = makeUser({ id: 'ex-1', roles: ['resident'] })
  return mount(RoundEntryPicker, { props: { fields, errors: {} }, global: { plugins: [createVuetify()] }, attachTo: document.body })
}

async function chooseIn(testid: string, optionText: string) {
  const field = document.querySelector(`[data-testid="${testid}"] .v-field`) as HTMLElement
  field.dispatchEvent(new MouseEvent('mousedown', { bubbles: true }))
  field.click()
  await vi.waitFor(() => expect([...document.querySelectorAll('.v-list-item')].some((el) => el.textContent?.includes(optionText))).toBe(true))
  ;([...document.querySelectorAll('.v-list-item')].find((el) => el.textContent?.includes(optionText)) as HTMLElement).click()
  await flushPromises()
}

describe('choosing a calibration round at the bedside', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.mocked(roundsApi.fetchRounds).mockResolvedValue([OPEN, CLOSED, ELSEWHERE])
  })

  afterEach(() => {
    document.body.innerHTML = ''
  })

  it('offers only the open rounds the examiner is in; choosing one asks for a code afresh', async () => {
    const wrapper = mountPicker({ patientCode: 'SM-0999' })
    await flushPromises()

    await chooseIn('round-entry-round', 'November round')

    const offered = [...document.querySelectorAll('.v-list-item')].map((el) => el.textContent)
    expect(offered).toEqual(expect.arrayContaining([expect.stringContaining('None'), expect.stringContaining('November round')]))
    expect(offered.some((t) => t?.includes('October round') || t?.includes('Not mine'))).toBe(false)
    expect(wrapper.emitted('update')).toEqual([[{ roundId: 'r-open', patientCode: '' }]])
  })

  it('once a round is chosen, the patient code comes from the round’s own codes', async () => {
    const wrapper = mountPicker({ roundId: 'r-open', patientCode: '' })
    await flushPromises()

    await chooseIn('round-entry-code', 'SM-0312')

    expect(wrapper.emitted('update')).toEqual([[{ patientCode: 'SM-0312' }]])
  })

  it('shows nothing to an examiner in no open round, and the patient step keeps its free code field', async () => {
    vi.mocked(roundsApi.fetchRounds).mockResolvedValue([CLOSED])
    useSessionStore().user = makeUser({ id: 'ex-1', roles: ['resident'] })

    const step = mount(BedsidePatientStep, {
      props: { fields: makeDraft().fields, errors: {}, teams: [{ id: 't-1', name: 'Cardiology A' }] },
      global: { plugins: [createVuetify()] },
    })
    await flushPromises()

    expect(step.find('[data-testid="round-entry-picker"]').exists()).toBe(false)
    expect(step.find('[data-testid="patient-code"]').exists()).toBe(true)
  })

  it('offline, a draft already in a round keeps its round and asks for the code as text', async () => {
    vi.mocked(roundsApi.fetchRounds).mockRejectedValue(new TypeError('Failed to fetch'))

    const wrapper = mountPicker({ roundId: 'r-open', patientCode: 'SM-0311' })
    await flushPromises()

    expect(wrapper.find('[data-testid="round-entry-code-text"]').exists()).toBe(true)
  })

  it('the draft carries its roundId into the exam it saves (and so into the outbox and the sync push), and a stored draft keeps it', () => {
    const draft = makeDraft({ ...WORKED_EXAMPLE, roundId: 'r-open', patientCode: 'SM-0311' })

    const input = parseDraft(draft)
    const reread = DraftRowSchema.parse(JSON.parse(JSON.stringify(draft)))

    expect(input?.roundId).toBe('r-open')
    expect(reread.fields.roundId).toBe('r-open')
  })
})
