import type { Page } from 'playwright-core'
import { describe, expect, it } from 'vitest'
import { NO_SERVICE_WORKER, signInAs, useDemoBrowser } from './browser.ts'

const demo = useDemoBrowser()

async function phonePage() {
  const context = await demo.browser.newContext({ ...NO_SERVICE_WORKER, viewport: { width: 360, height: 740 }, hasTouch: true, isMobile: true })
  return context.newPage()
}

// Sign-in hashes a password and the first visit loads lazy chunks: allow more than expect.poll's 1 s.
const WAIT = { timeout: 10_000 }

const title = (page: Page) => page.getByTestId('step-title').textContent()

async function next(page: Page, expectedTitle: string) {
  await page.getByTestId('step-next').click()
  await expect.poll(() => title(page), WAIT).toBe(expectedTitle)
}

/** Reads an exam through the API with a token from the refresh cookie (the access token lives in page memory only). */
function fetchExamInPage(page: Page, id: string) {
  return page.evaluate(async (examId) => {
    const { token } = await (await fetch('/api/auth/refresh', { method: 'POST' })).json()
    const response = await fetch(`/api/exams/${examId}`, { headers: { Authorization: `Bearer ${token}` } })
    return { status: response.status, body: await response.json() }
  }, id)
}

describe('recording the bedside exam on a phone in Chromium', () => {
  it('the resident records the worked example, survives a reload mid-flow, sees 13.7 cmH₂O and saves it to the log', async () => {
    const page = await phonePage()
    await signInAs(page, demo.server.url, 'resident@saltmarsh.test')
    await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe('/')
    await page.goto(`${demo.server.url}/record`)
    await expect.poll(() => title(page), WAIT).toBe('Patient and position')

    await page.getByTestId('patient-code').locator('input').fill('SM-0142')
    await page.getByTestId('inclination-input').locator('input').fill('45')
    await next(page, 'Pulsation')
    for (const sign of ['not-palpable', 'double-peaked', 'falls-on-inspiration']) await page.getByTestId(`sign-${sign}-present`).click()
    await next(page, 'Height')
    await page.getByTestId('column-top-seen').locator('input').check()
    await page.getByTestId('height-cm').locator('input').fill('4')
    await next(page, 'Waveform and manoeuvres')
    const draftPath = new URL(page.url()).pathname

    await page.reload()

    await expect.poll(() => title(page), WAIT).toBe('Waveform and manoeuvres')
    expect(new URL(page.url()).pathname).toBe(draftPath)
    expect(await page.getByTestId('live-cvp').textContent()).toContain('13.7 cmH₂O')
    await page.getByTestId('step-back').click()
    await expect.poll(() => page.getByTestId('height-cm').locator('input').inputValue(), WAIT).toBe('4')
    expect(await page.getByTestId('column-top-seen').locator('input').isChecked()).toBe(true)
    await next(page, 'Waveform and manoeuvres')
    await next(page, 'Review')

    expect(await page.getByTestId('exam-estimate-cmh2o').textContent()).toContain('13.7 cmH₂O')
    expect(await page.getByTestId('exam-estimate-mmhg').textContent()).toContain('10.1 mmHg')
    const reviewedBand = await page.getByTestId('exam-estimate-band').textContent()
    expect(await page.getByTestId('exam-caution').isVisible()).toBe(true)

    const examId = draftPath.split('/').pop()!
    await page.getByTestId('save-exam').click()

    await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe(`/exams/${examId}`)
    const saved = await fetchExamInPage(page, examId)
    expect(saved.status).toBe(200)
    expect(saved.body).toMatchObject({ id: examId, patientCode: 'SM-0142', inclinationDeg: 45, heightCm: 4, status: 'draft' })
    expect(saved.body.estimate.cvpCmH2O).toBeCloseTo(13.7, 5)
    // The device computed the band with the error term the server sent, so the band reviewed is the band stored.
    const [low, high] = saved.body.estimate.bandCmH2O as [number, number]
    expect(reviewedBand).toContain(`${low.toFixed(1)}–${high.toFixed(1)} cmH₂O`)

    await page.goto(`${demo.server.url}/exams`)

    await expect.poll(() => page.locator(`a[href="/exams/${examId}"]`).first().isVisible(), WAIT).toBe(true)
    await page.context().close()
  })
})
