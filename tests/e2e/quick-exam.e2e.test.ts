import type { Locator, Page } from 'playwright-core'
import { describe, expect, it } from 'vitest'
import { signInAs, useDemoBrowser } from './browser.ts'

const demo = useDemoBrowser()

// Sign-in hashes a password and the first visit loads lazy chunks: allow more than expect.poll's 1 s.
const WAIT = { timeout: 10_000 }
const ORDINARY_EXAM_MAX_TAPS = 10

async function phonePage() {
  const context = await demo.browser.newContext({ viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true })
  return context.newPage()
}

/**
 * Every tap of the test goes through `tap`, and the page counts the pointer presses it receives: the two counts must
 * agree, so no press escapes the count. Typing goes through `type` and is not a tap.
 */
async function tapCounter(page: Page) {
  await page.evaluate(() => {
    const w = window as unknown as { presses: number }
    w.presses = 0
    document.addEventListener('pointerdown', (event) => void (event.isTrusted && (w.presses += 1)), true)
  })
  let taps = 0
  return {
    tap: async (target: Locator) => {
      taps += 1
      await target.click()
    },
    type: (text: string) => page.keyboard.type(text),
    taps: () => taps,
    pressesSeen: () => page.evaluate(() => (window as unknown as { presses: number }).presses),
  }
}

/** Reads an exam through the API with a token from the refresh cookie (the access token lives in page memory only). */
function fetchExamInPage(page: Page, id: string) {
  return page.evaluate(async (examId) => {
    const { token } = await (await fetch('/api/auth/refresh', { method: 'POST' })).json()
    const response = await fetch(`/api/exams/${examId}`, { headers: { Authorization: `Bearer ${token}` } })
    return { status: response.status, body: await response.json() }
  }, id)
}

/** The focused field lies wholly above the sticky action bar. */
async function focusedFieldClearsTheBar(page: Page) {
  return page.evaluate(() => {
    const field = document.activeElement?.getBoundingClientRect()
    const bar = document.querySelector('[data-testid="bedside-action-bar"]')?.getBoundingClientRect()
    return Boolean(field && bar && field.height > 0 && field.bottom <= bar.top)
  })
}

/** Focuses a field from the top of the page, as the keyboard's Next key does, without a tap to scroll it first. */
async function focusFromTheTop(page: Page, selector: string) {
  // A panel or step still sliding open leaves the page too short to scroll the field clear: wait for it to settle.
  await page.waitForFunction(() => document.getAnimations().every((animation) => animation.playState !== 'running'))
  await page.evaluate((target) => {
    window.scrollTo(0, 0)
    document.querySelector<HTMLElement>(target)!.focus()
  }, selector)
}

async function next(page: Page, title: string) {
  await page.getByTestId('step-next').click()
  await expect.poll(() => page.getByTestId('step-title').textContent(), WAIT).toBe(title)
}

async function openRecording(page: Page, email: string, query: string) {
  await signInAs(page, demo.server.url, email)
  await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe('/')
  await page.goto(`${demo.server.url}/record${query}`)
}

const signState = (page: Page, sign: string) => page.getByTestId(`quick-sign-${sign}`).getAttribute('data-state')

describe('the quick exam on a 390 × 844 phone in Chromium', () => {
  it('records and submits an ordinary exam in at most 10 taps plus the numbers typed, and the server holds it as submitted', async () => {
    const page = await phonePage()
    await openRecording(page, 'resident@saltmarsh.test', '?mode=quick')
    await expect.poll(() => page.getByTestId('quick-exam').isVisible(), WAIT).toBe(true)
    await expect.poll(() => new URL(page.url()).pathname, WAIT).toMatch(/^\/record\/[0-9a-f-]{36}$/)
    const examId = new URL(page.url()).pathname.split('/').pop()!
    const user = await tapCounter(page)

    await user.tap(page.getByTestId('patient-code').locator('input'))
    await user.type('SM-0777')
    await user.tap(page.getByTestId('inclination-input').locator('input'))
    await user.type('45')
    await user.tap(page.getByTestId('quick-column-top-seen'))
    await user.tap(page.getByTestId('height-cm').locator('input'))
    expect(await focusedFieldClearsTheBar(page)).toBe(true)
    await user.type('4')
    for (const sign of ['not-palpable', 'double-peaked', 'falls-on-inspiration']) await user.tap(page.getByTestId(`quick-sign-${sign}`))
    await user.tap(page.getByTestId('quick-all-normal').locator('input'))

    await expect.poll(() => page.getByTestId('exam-estimate-cmh2o').textContent(), WAIT).toContain('13.7 cmH₂O')
    expect(await page.getByTestId('exam-estimate-mmhg').textContent()).toContain('10.1 mmHg')
    const band = await page.getByTestId('exam-estimate-band').textContent()
    expect(await page.getByTestId('exam-caution').isVisible()).toBe(true)

    await user.tap(page.getByTestId('quick-save-submit'))

    await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe(`/exams/${examId}`)
    expect(user.taps()).toBeLessThanOrEqual(ORDINARY_EXAM_MAX_TAPS)
    expect(await user.pressesSeen()).toBe(user.taps())
    const saved = await fetchExamInPage(page, examId)
    expect(saved.status).toBe(200)
    expect(saved.body).toMatchObject({
      id: examId,
      patientCode: 'SM-0777',
      inclinationDeg: 45,
      heightCm: 4,
      status: 'submitted',
      vein: 'right-internal',
    })
    expect(saved.body.venousSigns).toMatchObject({
      'not-palpable': 'present',
      'double-peaked': 'present',
      'falls-on-inspiration': 'present',
    })
    expect(saved.body.waveform).toEqual({ aWave: 'normal', vWave: 'normal', yDescent: 'normal' })
    const [low, high] = saved.body.estimate.bandCmH2O as [number, number]
    expect(band).toContain(`${low.toFixed(1)}–${high.toFixed(1)} cmH₂O`)
    await page.context().close()
  })

  it('switches from quick to guided mid-exam and back without losing a value, and remembers the mode chosen', async () => {
    const page = await phonePage()
    await openRecording(page, 'resident2@saltmarsh.test', '?mode=quick')
    await expect.poll(() => page.getByTestId('quick-exam').isVisible(), WAIT).toBe(true)
    await page.getByTestId('patient-code').locator('input').fill('SM-0778')
    await page.getByTestId('inclination-input').locator('input').fill('30')
    await page.getByTestId('quick-column-top-seen').click()
    await page.getByTestId('height-cm').locator('input').fill('3.5')
    await page.getByTestId('quick-sign-not-palpable').click()
    await expect.poll(() => signState(page, 'not-palpable'), WAIT).toBe('present')

    await page.getByTestId('record-mode-guided').click()

    await expect.poll(() => page.getByTestId('step-title').textContent(), WAIT).toBe('Patient and position')
    expect(new URL(page.url()).searchParams.get('mode')).toBe('guided')
    expect(await page.getByTestId('patient-code').locator('input').inputValue()).toBe('SM-0778')
    expect(await page.getByTestId('inclination-input').locator('input').inputValue()).toBe('30')
    await page.getByTestId('step-next').click()
    await expect.poll(() => page.getByTestId('step-title').textContent(), WAIT).toBe('Pulsation')
    await expect.poll(() => page.getByTestId('sign-not-palpable-present').getAttribute('class'), WAIT).toContain('v-btn--active')
    await page.getByTestId('sign-double-peaked-present').click()
    await page.getByTestId('step-next').click()
    await expect.poll(() => page.getByTestId('step-title').textContent(), WAIT).toBe('Height')
    await page.getByTestId('height-cm').locator('input').click()
    expect(await focusedFieldClearsTheBar(page)).toBe(true)
    expect(await page.getByTestId('height-cm').locator('input').inputValue()).toBe('3.5')

    await page.getByTestId('record-mode-quick').click()

    await expect.poll(() => page.getByTestId('quick-exam').isVisible(), WAIT).toBe(true)
    expect(await page.getByTestId('patient-code').locator('input').inputValue()).toBe('SM-0778')
    expect(await page.getByTestId('inclination-input').locator('input').inputValue()).toBe('30')
    expect(await page.getByTestId('height-cm').locator('input').inputValue()).toBe('3.5')
    expect(await page.getByTestId('quick-column-top-seen').getAttribute('class')).toContain('v-btn--active')
    expect(await signState(page, 'not-palpable')).toBe('present')
    expect(await signState(page, 'double-peaked')).toBe('present')

    const draftPath = new URL(page.url()).pathname
    await page.goto(`${demo.server.url}${draftPath}`)

    await expect.poll(() => page.getByTestId('quick-exam').isVisible(), WAIT).toBe(true)
    expect(await page.getByTestId('height-cm').locator('input').inputValue()).toBe('3.5')
    await page.context().close()
  })

  it('keeps the field being filled above the sticky action bar, in quick and in guided mode', async () => {
    const page = await phonePage()
    await openRecording(page, 'resident3@saltmarsh.test', '?mode=quick')
    await expect.poll(() => page.getByTestId('quick-exam').isVisible(), WAIT).toBe(true)
    await page.getByTestId('quick-more').locator('button').first().click()
    await expect.poll(() => page.getByTestId('notes').locator('textarea').first().isVisible(), WAIT).toBe(true)

    await focusFromTheTop(page, '[data-testid="notes"] textarea')

    await expect.poll(() => focusedFieldClearsTheBar(page), WAIT).toBe(true)

    await page.getByTestId('record-mode-guided').click()
    await expect.poll(() => page.getByTestId('step-title').textContent(), WAIT).toBe('Patient and position')
    await page.getByTestId('patient-code').locator('input').fill('SM-0779')
    await page.getByTestId('inclination-input').locator('input').fill('40')
    await next(page, 'Pulsation')
    await next(page, 'Height')
    await page.getByTestId('column-top-not-assessable').locator('input').check()
    await page.getByTestId('not-assessable-reason').click()
    await page.getByRole('option', { name: 'Body habitus (neck not visible)' }).click()
    await next(page, 'Waveform and manoeuvres')

    await focusFromTheTop(page, '.v-window-item--active [data-testid="notes"] textarea')

    await expect.poll(() => focusedFieldClearsTheBar(page), WAIT).toBe(true)
    await page.context().close()
  })

  it('offline, Save and submit keeps the exam in the outbox, and it reaches the server as submitted once the network is back', async () => {
    const page = await phonePage()
    await openRecording(page, 'resident4@saltmarsh.test', '?mode=quick')
    await expect.poll(() => page.getByTestId('quick-exam').isVisible(), WAIT).toBe(true)
    await expect.poll(() => new URL(page.url()).pathname, WAIT).toMatch(/^\/record\/[0-9a-f-]{36}$/)
    const examId = new URL(page.url()).pathname.split('/').pop()!
    await page.getByTestId('patient-code').locator('input').fill('SM-0780')
    await page.getByTestId('inclination-input').locator('input').fill('45')
    await page.getByTestId('quick-column-top-seen').click()
    await page.getByTestId('height-cm').locator('input').fill('2')
    for (const sign of ['not-palpable', 'double-peaked', 'falls-on-inspiration']) await page.getByTestId(`quick-sign-${sign}`).click()
    await page.context().setOffline(true)

    await page.getByTestId('quick-save-submit').click()

    await expect.poll(() => page.getByTestId('save-notice').textContent(), WAIT).toContain('submitted for countersignature by itself')
    await page.context().setOffline(false)
    await expect.poll(async () => (await fetchExamInPage(page, examId)).body.status, WAIT).toBe('submitted')
    await page.context().close()
  })
})
