import type { Page } from 'playwright-core'
import { describe, it } from 'vitest'
import { WAIT, type Tab } from './axe-audit.ts'
import { auditScreens, go, tabFor, type Screen } from './axe-screens.ts'
import { useDemoBrowser } from './browser.ts'

const demo = useDemoBrowser()
// Each test walks its screens in four looks on a busy machine; a page only takes this long when something is wrong.
const LONG = 240_000
const RESIDENT = 'resident@saltmarsh.test'

const READING: Screen[] = [
  { name: 'home', open: (tab) => go(tab, '/'), ready: '[data-testid=caution-note]' },
  { name: 'exam log', open: (tab) => go(tab, '/exams'), ready: ':is([data-testid=exam-table], [data-testid=exam-list]) a[href^="/exams/"]' },
  {
    name: 'exam detail',
    open: async (tab) =>
      go(tab, (await tab.page.locator(':is([data-testid=exam-table], [data-testid=exam-list]) a[href^="/exams/"]').first().getAttribute('href', WAIT))!),
    ready: '[data-testid=exam-version]',
  },
]

const stepTitle = (page: Page) => page.getByTestId('step-title').textContent()

async function nextStep({ page, expect }: Tab, title: string) {
  await page.getByTestId('step-next').click()
  await expect.poll(() => stepTitle(page), WAIT).toBe(title)
}

/** A new exam at its first step: a draft kept from an earlier look is put aside with "Start a new exam". */
async function newGuidedExam(tab: Tab) {
  const { page, expect } = tab
  await go(tab, '/record?mode=guided')
  await expect.poll(() => new URL(page.url()).pathname, WAIT).toMatch(/^\/record\/./)
  if (await page.getByTestId('start-new-exam').isVisible()) await page.getByTestId('start-new-exam').click()
  await expect.poll(() => stepTitle(page), WAIT).toBe('Patient and position')
}

const GUIDED: Screen[] = [
  {
    name: 'guided step 1, patient and position',
    open: async (tab) => {
      await newGuidedExam(tab)
      const { page } = tab
      await page.getByTestId('patient-code').locator('input').fill('SM-0142')
      await page.getByTestId('inclination-input').locator('input').fill('45')
    },
    ready: '[data-testid=step-title]',
  },
  {
    name: 'guided step 2, pulsation',
    open: async (tab) => {
      await nextStep(tab, 'Pulsation')
      for (const sign of ['not-palpable', 'double-peaked', 'falls-on-inspiration'])
        await tab.page.getByTestId(`sign-${sign}-present`).click()
    },
    ready: '[data-testid=step-title]',
  },
  {
    name: 'guided step 3, height',
    open: async (tab) => {
      await nextStep(tab, 'Height')
      await tab.page.getByTestId('column-top-seen').locator('input').check()
      await tab.page.getByTestId('height-cm').locator('input').fill('4')
    },
    ready: '[data-testid=live-cvp]',
  },
  { name: 'guided step 4, waveform', open: (tab) => nextStep(tab, 'Waveform and manoeuvres'), ready: '[data-testid=step-title]' },
  { name: 'guided step 5, review', open: (tab) => nextStep(tab, 'Review'), ready: '[data-testid=exam-estimate-cmh2o]' },
]

const quickExam: Screen = { name: 'quick exam', open: (tab) => go(tab, '/record?mode=quick'), ready: '[data-testid=quick-exam] [data-testid=quick-title]' }

/** The recording screens checked: the five guided steps, then the quick exam. */
const RECORDING: Screen[] = [...GUIDED, quickExam]

describe.concurrent('accessibility in Chromium (axe-core), on a phone and a desktop, in the light and the dark theme', () => {
  it(
    'home, the exam log and an exam have no serious or critical violation and one h1, as the resident sees them',
    async ({ expect }) => {
      const tab = await tabFor(expect, demo.browser, demo.server.url, RESIDENT)

      expect(await auditScreens(tab, READING)).toEqual([])
    },
    LONG,
  )

  it(
    'each step of the guided bedside exam and the quick exam have none, filled in as a resident goes',
    async ({ expect }) => {
      const tab = await tabFor(expect, demo.browser, demo.server.url, RESIDENT)

      expect(await auditScreens(tab, RECORDING)).toEqual([])
    },
    LONG,
  )

})
