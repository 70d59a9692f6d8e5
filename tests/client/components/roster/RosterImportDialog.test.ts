import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import type { RosterApplyResult, RosterPreview } from '#shared/schemas/roster'
import RosterImportDialog from '@/components/roster/RosterImportDialog.vue'
import * as roster from '@/api/roster'
import { httpError } from '../../factories/http-error'

vi.mock('@/api/roster')

const PREVIEW: RosterPreview = {
  counts: { new: 1, changed: 1, unchanged: 1, invalid: 2 },
  ignoredColumns: ['Pager'],
  rows: [
    { line: 2, email: 'fay.quist@saltmarsh.test', displayName: 'Dr Fay Quist', roles: ['resident'], teams: ['Medical ICU'], status: 'new' },
    {
      line: 3,
      email: 'priya.raman@saltmarsh.test',
      displayName: 'Dr Priya Raman',
      roles: ['resident', 'attending'],
      teams: ['Acute Medical Unit'],
      status: 'changed',
      changes: { roles: { from: ['resident'], to: ['resident', 'attending'] } },
    },
    { line: 4, email: 'marta.lindgren@saltmarsh.test', displayName: 'Marta Lindgren', roles: ['educator'], teams: [], status: 'unchanged' },
    {
      line: 5,
      email: 'not-an-email',
      displayName: '',
      roles: ['resident'],
      teams: [],
      status: 'invalid',
      reasons: { email: '"not-an-email" is not a valid e-mail address.', displayName: 'Missing display name.' },
    },
    {
      line: 6,
      email: 'ben.okafor@saltmarsh.test',
      displayName: 'Dr Ben Okafor',
      roles: ['nurse'],
      teams: ['Ward 9 South'],
      status: 'invalid',
      reasons: { roles: 'Unknown role "nurse"; roles are resident, attending, educator, admin.', team: 'No team is named "Ward 9 South".' },
    },
  ],
}

const text = () => document.querySelector('[data-testid="roster-dialog"]')?.textContent ?? ''
const all = (testId: string) => [...document.querySelectorAll<HTMLElement>(`[data-testid="${testId}"]`)]

async function openDialog() {
  const wrapper = mount(RosterImportDialog, { props: { modelValue: true }, attachTo: document.body, global: { plugins: [createVuetify()] } })
  await flushPromises()
  return wrapper
}

async function chooseFile(name = 'roster.csv', content = 'email,display name,roles,team\n') {
  const input = document.querySelector<HTMLInputElement>('[data-testid="roster-dialog"] input[type="file"]')!
  Object.defineProperty(input, 'files', { value: [new File([content], name, { type: 'text/csv' })], configurable: true })
  input.dispatchEvent(new Event('change'))
  await flushPromises()
}

async function click(testId: string) {
  document.querySelector<HTMLElement>(`[data-testid="${testId}"]`)!.click()
  await flushPromises()
}

describe('RosterImportDialog', () => {
  beforeEach(() => {
    document.body.innerHTML = ''
    vi.mocked(roster.previewRoster).mockReset()
    vi.mocked(roster.applyRoster).mockReset()
  })

  it('sends the chosen file for a preview and lists each row with its line, status and e-mail', async () => {
    vi.mocked(roster.previewRoster).mockResolvedValue(PREVIEW)
    await openDialog()

    await chooseFile('saltmarsh.csv')
    await click('roster-check')

    expect(vi.mocked(roster.previewRoster).mock.calls[0]![0].name).toBe('saltmarsh.csv')
    expect(all('roster-row-status').map((c) => c.textContent!.trim())).toEqual(['New', 'Changed', 'Unchanged', 'Invalid', 'Invalid'])
    expect(all('roster-row-email').map((c) => c.textContent)).toEqual(PREVIEW.rows.map((r) => r.email))
    expect(all('roster-count-invalid')[0]!.textContent).toContain('Invalid: 2')
    expect(text()).toContain('2 rows have problems and will be skipped')
    expect(text()).toContain('Columns not read: Pager.')
  })

  it('shows every reason of an invalid row beside its field, and what a changed row changes', async () => {
    vi.mocked(roster.previewRoster).mockResolvedValue(PREVIEW)
    await openDialog()
    await chooseFile()

    await click('roster-check')

    const details = all('roster-row-details').map((d) => [...d.querySelectorAll('li')].map((li) => li.textContent!.replace(/\s+/g, ' ').trim()))
    expect(details).toEqual([
      ['Roles: resident → resident, attending'],
      ['E-mail: "not-an-email" is not a valid e-mail address.', 'Display name: Missing display name.'],
      ['Roles: Unknown role "nurse"; roles are resident, attending, educator, admin.', 'Team: No team is named "Ward 9 South".'],
    ])
  })

  it('narrows the table to one status when the others are switched off', async () => {
    vi.mocked(roster.previewRoster).mockResolvedValue(PREVIEW)
    await openDialog()
    await chooseFile()
    await click('roster-check')

    for (const status of ['new', 'changed', 'unchanged']) await click(`roster-count-${status}`)

    expect(all('roster-row-status').map((c) => c.textContent!.trim())).toEqual(['Invalid', 'Invalid'])
  })

  it('imports the same file on request, reports what was done and tells its host', async () => {
    vi.mocked(roster.previewRoster).mockResolvedValue(PREVIEW)
    const result: RosterApplyResult = { ...PREVIEW, created: 1, updated: 1, skipped: 2 }
    vi.mocked(roster.applyRoster).mockResolvedValue(result)
    const wrapper = await openDialog()
    await chooseFile('saltmarsh.csv')
    await click('roster-check')

    expect(document.querySelector('[data-testid="roster-apply"]')!.textContent).toContain('Import 1 new, update 1')
    await click('roster-apply')

    expect(vi.mocked(roster.applyRoster).mock.calls[0]![0].name).toBe('saltmarsh.csv')
    expect(document.querySelector('[data-testid="roster-result"]')!.textContent!.replace(/\s+/g, ' ')).toContain(
      'Created 1 account and e-mailed each an invitation; updated 1; skipped 2 invalid rows.',
    )
    expect(wrapper.emitted('applied')).toEqual([[result]])
  })

  it('offers nothing to import when every row is already up to date', async () => {
    vi.mocked(roster.previewRoster).mockResolvedValue({
      counts: { new: 0, changed: 0, unchanged: 1, invalid: 0 },
      ignoredColumns: [],
      rows: [PREVIEW.rows[2]!],
    })
    await openDialog()
    await chooseFile()

    await click('roster-check')

    const apply = document.querySelector<HTMLButtonElement>('[data-testid="roster-apply"]')!
    expect(apply.textContent).toContain('Nothing to import')
    expect(apply.disabled).toBe(true)
  })

  it('shows the server’s message about the file on the file field, and no preview', async () => {
    const message = 'This file is a PNG image, not a CSV text file. In your spreadsheet, save the roster as comma-separated text in UTF-8 and upload that file.'
    vi.mocked(roster.previewRoster).mockRejectedValue(httpError(415, 'roster-not-csv', message, { file: message }))
    await openDialog()
    await chooseFile('photo.csv')

    await click('roster-check')

    expect(text()).toContain(message)
    expect(document.querySelector('[data-testid="roster-preview-table"]')).toBeNull()
  })
})
