import { afterEach, describe, expect, it } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import RoundProgressGrid from '@/components/rounds/RoundProgressGrid.vue'
import { overflowsSideways } from '@/components/rounds/sideways-overflow'
import { makeRound } from '../../views/RoundFixtures'

/** Gives every element the widths a phone would measure for the grid: the content wider than the box, or not. */
function measureAs(scrollWidth: number, clientWidth: number) {
  Object.defineProperty(HTMLElement.prototype, 'scrollWidth', { configurable: true, get: () => scrollWidth })
  Object.defineProperty(HTMLElement.prototype, 'clientWidth', { configurable: true, get: () => clientWidth })
}

async function mountGrid() {
  const wrapper = mount(RoundProgressGrid, {
    props: { round: makeRound() },
    global: { plugins: [createVuetify()] },
    attachTo: document.body,
  })
  await flushPromises()
  return wrapper
}

afterEach(() => {
  Reflect.deleteProperty(HTMLElement.prototype, 'scrollWidth')
  Reflect.deleteProperty(HTMLElement.prototype, 'clientWidth')
  document.body.innerHTML = ''
})

describe('overflowsSideways', () => {
  it('is true only when the content is wider than the box by more than a pixel of rounding', () => {
    expect(overflowsSideways({ scrollWidth: 720, clientWidth: 360 })).toBe(true)
    expect(overflowsSideways({ scrollWidth: 361, clientWidth: 360 })).toBe(false)
    expect(overflowsSideways(null)).toBe(false)
  })
})

describe('RoundProgressGrid', () => {
  it('on a narrow screen, says the table scrolls sideways and lets the keyboard scroll it', async () => {
    measureAs(720, 360)

    const wrapper = await mountGrid()

    expect(wrapper.find('[data-testid="round-grid-scroll-hint"]').text()).toContain('Scroll sideways')
    const box = wrapper.find('[data-testid="round-grid-box"]')
    expect(box.attributes('tabindex')).toBe('0')
    expect(box.attributes('aria-label')).toBeTruthy()
  })

  it('when every column fits, shows no hint', async () => {
    measureAs(600, 600)

    const wrapper = await mountGrid()

    expect(wrapper.find('[data-testid="round-grid-scroll-hint"]').exists()).toBe(false)
  })

  it('keeps the patient column in place: its header and every row header are the sticky cells', async () => {
    const wrapper = await mountGrid()

    const sticky = wrapper.findAll('.round-grid-first')
    expect(sticky[0]!.text()).toBe('Patient')
    expect(sticky.slice(1).map((cell) => cell.attributes('scope'))).toEqual(makeRound().patientCodes.map(() => 'row'))
  })
})
