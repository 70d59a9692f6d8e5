import { randomUUID } from 'node:crypto'
import type { Page } from 'playwright-core'
import { describe, expect, it } from 'vitest'
import { DEMO_PASSWORD, NO_SERVICE_WORKER, signInAs, useDemoBrowser } from './browser.ts'

const demo = useDemoBrowser()
const RESIDENT = 'resident@saltmarsh.test'

// Sign-in hashes a password and the first visit loads lazy chunks: allow more than expect.poll's 1 s.
const WAIT = { timeout: 10_000 }

const title = (page: Page) => page.getByTestId('step-title').textContent()
const code = () => `SM-CL-${randomUUID().slice(0, 6).toUpperCase()}`

async function phonePage() {
  const context = await demo.browser.newContext({ ...NO_SERVICE_WORKER, viewport: { width: 360, height: 740 }, hasTouch: true, isMobile: true })
  const page = await context.newPage()
  await signInAs(page, demo.server.url, RESIDENT)
  await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe('/')
  return page
}

async function next(page: Page, expectedTitle: string) {
  await page.getByTestId('step-next').click()
  await expect.poll(() => title(page), WAIT).toBe(expectedTitle)
}

/** The first two steps: a new patient at 45°, then each venous sign with the state given. */
async function recordPulsation(page: Page, signs: Record<string, 'present' | 'absent'>) {
  await page.goto(`${demo.server.url}/record`)
  await expect.poll(() => title(page), WAIT).toBe('Patient and position')
  await page.getByTestId('patient-code').locator('input').fill(code())
  await page.getByTestId('inclination-input').locator('input').fill('45')
  await next(page, 'Pulsation')
  for (const [sign, state] of Object.entries(signs)) await page.getByTestId(`sign-${sign}-${state}`).click()
  await next(page, 'Height')
  await page.getByTestId('column-top-seen').locator('input').check()
}

const VENOUS = { 'not-palpable': 'present', 'double-peaked': 'present', 'falls-on-inspiration': 'present' } as const

describe('the clinical reading of an exam in Chromium', () => {
  it('"2,5" reads as 2.5 cm; 2 cm at 45° is "not elevated", "normal or high" with the frame note; the band reviewed is the band saved', async () => {
    const page = await phonePage()
    await recordPulsation(page, VENOUS)

    const height = page.getByTestId('height-cm').locator('input')
    await height.fill('2,5')
    // Seth 2002: 9.7 cm at 45°, so 2.5 cm reads 12.2 cmH₂O (never 25 cm, 34.7 cmH₂O).
    await expect.poll(() => page.getByTestId('live-cvp').textContent(), WAIT).toContain('12.2 cmH₂O')
    expect(await height.inputValue()).toBe('2,5')
    await height.fill('2')
    await expect.poll(() => page.getByTestId('live-cvp').textContent(), WAIT).toContain('11.7 cmH₂O')
    await next(page, 'Waveform and manoeuvres')
    await next(page, 'Review')

    // McGee 1998: not more than 3 cm is not elevated; the band reaches normal (5–10) and high (> 10), Cook 1990.
    expect(await page.getByTestId('exam-elevated').textContent()).toContain('JVP not elevated')
    expect(await page.getByTestId('exam-category').textContent()).toContain('normal or high')
    expect(await page.getByTestId('exam-frame-note').textContent()).toContain('the CT-derived offset is 9.7 cm')
    // The demo's paired exams give a local error term: the device shows the band with the server's own term.
    expect(await page.getByTestId('exam-model').textContent()).toContain('the local error term')
    const reviewed = await page.getByTestId('exam-estimate-band').textContent()
    const examId = new URL(page.url()).pathname.split('/').pop()!
    await page.getByTestId('save-exam').click()

    await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe(`/exams/${examId}`)
    await expect.poll(() => page.getByTestId('exam-estimate-band').textContent(), WAIT).toBe(reviewed)
    expect(await page.getByTestId('exam-reviewed-changed').count()).toBe(0)
    expect(await page.getByTestId('exam-elevated').textContent()).toContain('JVP not elevated')
    await page.context().close()
  })

  // Cook & Simel 1996 (JAMA 275:630–634): a palpable pulsation behaves like the carotid.
  it('a palpable pulsation stops the save until the examiner confirms the column is venous; then the exam can be submitted', async () => {
    const page = await phonePage()
    await recordPulsation(page, { ...VENOUS, 'not-palpable': 'absent', 'changes-with-position': 'present' })
    await page.getByTestId('height-cm').locator('input').fill('4')
    await next(page, 'Waveform and manoeuvres')
    await next(page, 'Review')
    expect(await page.getByTestId('exam-arterial-warning').textContent()).toContain('Arterial evidence')

    await page.getByTestId('save-exam').click()

    await expect.poll(() => page.getByTestId('venous-confirm').textContent(), WAIT).toContain('confirm that the column you measured is venous')
    expect(await title(page)).toBe('Review')
    const examId = new URL(page.url()).pathname.split('/').pop()!
    await page.getByTestId('venous-confirm-checkbox').locator('input').check()
    await page.getByTestId('save-exam').click()
    await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe(`/exams/${examId}`)
    await page.getByTestId('exam-submit').click()
    await expect.poll(() => page.getByTestId('status-submitted').count(), WAIT).toBe(1)
    await page.context().close()
  })

  it('an exam saved with a palpable pulsation and no confirmation is stopped at submit until the author confirms', async () => {
    const login = await fetch(`${demo.server.url}/api/auth/login`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: RESIDENT, password: DEMO_PASSWORD }),
    })
    const { token, user } = (await login.json()) as { token: string; user: { teams: { id: string }[] } }
    const id = randomUUID()
    const exam = {
      ...{ id, patientCode: code(), teamId: user.teams[0]!.id, examinedAt: new Date().toISOString(), inclinationDeg: 45 },
      ...{ vein: 'right-internal', columnTop: 'seen', heightMethod: 'vertical', heightCm: 4, readingPrecision: 'ruler' },
      venousSigns: { 'not-palpable': 'absent', 'double-peaked': 'present', 'falls-on-inspiration': 'present' },
    }
    const created = await fetch(`${demo.server.url}/api/exams`, {
      method: 'POST',
      headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' },
      body: JSON.stringify(exam),
    })
    expect(created.status).toBe(201)
    const context = await demo.browser.newContext({ ...NO_SERVICE_WORKER, viewport: { width: 1280, height: 800 } })
    const page = await context.newPage()
    await signInAs(page, demo.server.url, RESIDENT)
    await expect.poll(() => page.getByTestId('nav-exams').isVisible(), WAIT).toBe(true)
    await page.goto(`${demo.server.url}/exams/${id}`)

    await page.getByTestId('exam-submit').click()
    await expect.poll(() => page.getByTestId('venous-confirm').textContent(), WAIT).toContain('Confirm that the column is venous before submitting')
    expect(await page.getByTestId('status-draft').count()).toBe(1)
    await page.getByTestId('venous-confirm-checkbox').locator('input').check()
    await page.getByTestId('exam-submit').click()

    await expect.poll(() => page.getByTestId('status-submitted').count(), WAIT).toBe(1)
    await context.close()
  })
})
