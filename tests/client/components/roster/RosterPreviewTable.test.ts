import { afterEach, describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import type { RosterRow } from '#shared/schemas/roster'
import RosterPreviewTable from '@/components/roster/RosterPreviewTable.vue'

const rows: RosterRow[] = [
  { line: 2, email: 'a@example.test', displayName: 'Dr A', roles: ['resident'], teams: ['Ward 7'], status: 'new' },
  { line: 3, email: 'b@example.test', displayName: 'Dr B', roles: ['resident'], teams: ['Ward 7'], status: 'unchanged' },
]

function mountTable() {
  return mount(RosterPreviewTable, {
    props: { rows, counts: { new: 1, changed: 0, unchanged: 1, invalid: 0 } },
    global: { plugins: [createVuetify()] },
    attachTo: document.body,
  })
}

// The chip's filter tick stays in the page while hidden (v-show), so only the icons shown count.
const iconsIn = (element: Element) =>
  [...element.querySelectorAll('.v-icon')].filter((icon) => !icon.closest('[style*="display: none"]')).length

describe('RosterPreviewTable status filter', () => {
  afterEach(() => {
    document.body.innerHTML = ''
  })

  it('shows one icon on each status chip, whether its rows are shown or hidden', async () => {
    const wrapper = mountTable()
    const chip = () => wrapper.find('[data-testid="roster-count-new"]')

    const shownIcons = iconsIn(chip().element)
    await chip().trigger('click')
    const hiddenIcons = iconsIn(chip().element)

    expect(shownIcons).toBe(1)
    expect(hiddenIcons).toBe(1)
    expect(wrapper.findAll('[data-testid="roster-row-email"]').map((cell) => cell.text())).toEqual(['b@example.test'])
  })

  it("shows one icon on each row's status chip", () => {
    const wrapper = mountTable()

    for (const chip of wrapper.findAll('[data-testid="roster-row-status"]')) expect(iconsIn(chip.element)).toBe(1)
  })
})
