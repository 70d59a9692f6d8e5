import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount, type VueWrapper } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import Papa from 'papaparse'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import AgreementView from '@/views/AgreementView.vue'
import { routes } from '@/router/routes'
import { useSessionStore } from '@/stores/session'
import * as api from '@/api/agreement'
import * as teamsApi from '@/api/teams'
import { HAND_PAIRS, makePair, makeSummary, makeTrend, UNAVAILABLE } from '../components/agreement/make-agreement'
import { httpError } from '../factories/http-error'
import { makeUser } from '../factories/user'

vi.mock('@/api/agreement', () => ({ fetchAgreementSummary: vi.fn(), fetchAgreementTrend: vi.fn(), fetchAgreementPairs: vi.fn() }))
vi.mock('@/api/teams', () => ({ fetchTeams: vi.fn() }))

const pairs = HAND_PAIRS.map(([r, a], i) => makePair(r, a, { patientCode: `px-${i}` }))

async function mountView(roles = makeUser({ roles: ['educator'], teams: [] }).roles) {
  useSessionStore().user = makeUser({ roles })
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push({ name: 'agreement' })
  const wrapper = mount(AgreementView, { global: { plugins: [createVuetify(), router] }, attachTo: document.body })
  await flushPromises()
  return wrapper
}

function chooseIn(wrapper: VueWrapper, testId: string, value: string) {
  const select = wrapper.findAllComponents({ name: 'VSelect' }).find((s) => s.attributes('data-testid') === testId)!
  return select.setValue(value)
}

describe('AgreementView', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.mocked(api.fetchAgreementSummary).mockReset().mockResolvedValue(makeSummary())
    vi.mocked(api.fetchAgreementTrend).mockReset().mockResolvedValue(makeTrend())
    vi.mocked(api.fetchAgreementPairs).mockReset().mockResolvedValue({ pairs, total: pairs.length, page: 1, pageSize: 1000 })
    vi.mocked(teamsApi.fetchTeams).mockReset().mockResolvedValue([{ id: 't-ward', name: 'Ward 7 North — Cardiology', members: [] }])
  })

  afterEach(() => {
    document.body.innerHTML = ''
    Reflect.deleteProperty(URL, 'createObjectURL')
    Reflect.deleteProperty(URL, 'revokeObjectURL')
  })

  it('shows the caution, the figures, the plots with their captions, the residents’ bias and the kappas', async () => {
    const wrapper = await mountView()

    expect(wrapper.find('[data-testid="agreement-caution"]').text()).toBe(CAUTION_TEXT)
    expect(wrapper.find('[data-testid="agreement-n"]').text()).toBe('4')
    expect(wrapper.find('[data-testid="agreement-bias"]').text()).toContain('−0.9 cm')
    expect(wrapper.find('[data-testid="bland-altman"] canvas').exists()).toBe(true)
    expect(wrapper.find('[data-testid="bland-altman-caption"]').text()).toContain('Bland–Altman plot of 4 pairs')
    expect(wrapper.find('[data-testid="pair-scatter-caption"]').text()).toContain('3 points lie below the line')
    expect(wrapper.find('[data-testid="agreement-trend-caption"]').text()).toContain('Jan 2026: 2 pairs')
    expect(wrapper.find('[data-testid="resident-bias-u-res"] [data-testid="resident-bias-value"]').text()).toBe('−0.9')
    expect(wrapper.find('[data-testid="kappa-elevated"]').text()).toContain('moderate')
    expect(wrapper.text()).not.toContain('NaN')
  })

  it('asks for the summary, the trend and the newest 1,000 pairs with no filters at first', async () => {
    await mountView()

    expect(api.fetchAgreementSummary).toHaveBeenCalledWith({ from: undefined, to: undefined, teamId: undefined, inclinationBand: undefined, vein: undefined })
    expect(api.fetchAgreementTrend).toHaveBeenCalledTimes(1)
    expect(api.fetchAgreementPairs).toHaveBeenCalledWith(expect.objectContaining({ page: 1, pageSize: 1000 }))
  })

  it('sends the chosen team, inclination band and vein to every request', async () => {
    const wrapper = await mountView()

    await chooseIn(wrapper, 'agreement-filter-team', 't-ward')
    await chooseIn(wrapper, 'agreement-filter-band', '30-59')
    await chooseIn(wrapper, 'agreement-filter-vein', 'internal')
    await flushPromises()

    const expected = { teamId: 't-ward', inclinationBand: '30-59', vein: 'internal' }
    expect(vi.mocked(api.fetchAgreementSummary).mock.lastCall![0]).toMatchObject(expected)
    expect(vi.mocked(api.fetchAgreementTrend).mock.lastCall![0]).toMatchObject(expected)
    expect(vi.mocked(api.fetchAgreementPairs).mock.lastCall![0]).toMatchObject(expected)
  })

  it('sends the start of the chosen local day as `from`', async () => {
    const wrapper = await mountView()

    await wrapper.find('[data-testid="agreement-filter-from"] input').setValue('2026-03-01')
    await flushPromises()

    expect(vi.mocked(api.fetchAgreementSummary).mock.lastCall![0]).toMatchObject({ from: new Date('2026-03-01T00:00:00').toISOString() })
  })

  it('downloads every filtered pair as CSV, page by page, with the header, team names and the caution last', async () => {
    const many = Array.from({ length: 1000 }, (_, i) => makePair(3, 4, { patientCode: `px-${i}` }))
    const wrapper = await mountView()
    await chooseIn(wrapper, 'agreement-filter-band', '0-29')
    await flushPromises()
    vi.mocked(api.fetchAgreementPairs)
      .mockResolvedValueOnce({ pairs: many, total: 1001, page: 1, pageSize: 1000 })
      .mockResolvedValueOnce({ pairs: [makePair(5, 4, { patientCode: 'px-last' })], total: 1001, page: 2, pageSize: 1000 })
    const blobs: Blob[] = []
    // jsdom has no object URLs; these take the place of the browser's, keeping the Blob to read back.
    Object.assign(URL, { createObjectURL: vi.fn((b: Blob) => (blobs.push(b), 'blob:x')), revokeObjectURL: vi.fn() })

    await wrapper.find('[data-testid="agreement-download"]').trigger('click')
    await flushPromises()

    expect(vi.mocked(api.fetchAgreementPairs).mock.calls.slice(-2).map((c) => [c[0]!.page, c[0]!.inclinationBand, c[0]!.export])).toEqual([
      [1, '0-29', 'csv'],
      [2, '0-29', 'csv'],
    ])
    expect(blobs).toHaveLength(1)
    expect(blobs[0]!.type).toBe('text/csv;charset=utf-8')
    const text = (await blobs[0]!.text()).replace(/^\ufeff/, '')
    const rows = Papa.parse<string[]>(text, { skipEmptyLines: true }).data
    expect(rows[0]![0]).toBe('patient_code')
    expect(rows).toHaveLength(1 + 1001 + 1)
    expect(rows[1001]![0]).toBe('px-last')
    expect(rows[1]![rows[0]!.indexOf('first_team')]).toBe('Ward 7 North — Cardiology')
    expect(rows.at(-1)![0]).toBe(`Caution: ${CAUTION_TEXT}`)
  })

  it('shows each statistic’s stated reason when there are too few pairs', async () => {
    vi.mocked(api.fetchAgreementSummary).mockResolvedValue(
      makeSummary({ n: 1, blandAltman: UNAVAILABLE, icc: UNAVAILABLE, kappaElevated: UNAVAILABLE, kappaCategory: UNAVAILABLE, byExaminer: [] }),
    )
    vi.mocked(api.fetchAgreementPairs).mockResolvedValue({ pairs: [pairs[0]!], total: 1, page: 1, pageSize: 1000 })

    const wrapper = await mountView()

    expect(wrapper.find('[data-testid="agreement-ba-reason"]').text()).toContain('Needs at least 2 pairs; only 1 matches')
    expect(wrapper.find('[data-testid="agreement-icc-reason"]').text()).toContain('Needs at least 2 pairs')
    expect(wrapper.find('[data-testid="kappa-elevated-reason"]').exists()).toBe(true)
    expect(wrapper.text()).not.toMatch(/NaN|undefined/)
  })

  it('shows the server’s refusal, e.g. a resident asking about someone else', async () => {
    vi.mocked(api.fetchAgreementSummary).mockRejectedValue(httpError(403, 'forbidden', 'Residents may see only their own agreement'))

    const wrapper = await mountView(['resident'])

    expect(wrapper.text()).toContain('Residents may see only their own agreement')
    expect(wrapper.find('[data-testid="agreement-caution"]').exists()).toBe(true)
  })

  it('is open to residents, attendings and educators, and lazy-loaded', () => {
    const route = routes.find((r) => r.name === 'agreement')!

    expect(route.path).toBe('/agreement')
    expect(route.meta?.roles).toEqual(['resident', 'attending', 'educator'])
    expect(typeof route.component).toBe('function')
  })

  it('links educators and attendings to the accuracy view, but not residents', async () => {
    const educator = await mountView(['educator'])
    const link = educator.find('[data-testid="agreement-accuracy-link"]').attributes('href')
    educator.unmount()

    const resident = await mountView(['resident'])

    expect(link).toBe('/agreement/accuracy')
    expect(resident.find('[data-testid="agreement-accuracy-link"]').exists()).toBe(false)
  })
})
