import { randomUUID } from 'node:crypto'
import type { Page } from 'playwright-core'
import { describe, expect, it } from 'vitest'
import { NO_SERVICE_WORKER, signInAs, useDemoBrowser } from './browser.ts'

// Sign-in hashes a password and first visits load lazy chunks on a shared 2-core machine: wait generously.
const WAIT = { timeout: 15_000 }

const demo = useDemoBrowser()

async function freshPage(width = 1280): Promise<Page> {
  const context = await demo.browser.newContext({ ...NO_SERVICE_WORKER, viewport: { width, height: 800 } })
  return context.newPage()
}

/** Opens the admin Mailbox screen until the message with this subject has arrived, and returns its text. */
async function readMail(page: Page, subject: string): Promise<string> {
  await page.goto(`${demo.server.url}/admin/mailbox`)
  const message = page.getByTestId('mail-message').filter({ hasText: subject })
  await expect
    .poll(async () => {
      if ((await message.count()) > 0) return true
      await page.getByTestId('mailbox-refresh').click()
      return false
    }, WAIT)
    .toBe(true)
  await message.first().locator('button').first().click()
  const text = message.first().getByTestId('mail-text')
  await text.waitFor(WAIT)
  return text.innerText()
}

describe('inviting a person in Chromium', () => {
  it('the admin invites, the invitation arrives in the demo mailbox, its link sets a password, and the person signs in', async () => {
    const email = `new.resident.${randomUUID().slice(0, 6)}@saltmarsh.test`
    const admin = await freshPage()
    await signInAs(admin, demo.server.url, 'admin@saltmarsh.test')
    await admin.getByTestId('nav-accounts').waitFor(WAIT)

    await admin.goto(`${demo.server.url}/admin/accounts`)
    await admin.getByTestId('account-invite').click()
    await admin.getByTestId('account-email').locator('input').fill(email)
    await admin.getByTestId('account-display-name').locator('input').fill('Dr Ada Okonkwo')
    await admin.getByTestId('account-role-resident').locator('input').check()
    await admin.getByTestId('account-save').click()
    await expect.poll(() => admin.getByTestId('account-notice').innerText().catch(() => ''), WAIT).toContain(`Invitation sent to ${email}`)

    const mail = await readMail(admin, 'Morgan Reyes invites you to Plumbline')
    const link = /(http\S+\/invitation#token=\S+)/.exec(mail)?.[1]
    expect(link, 'the invitation holds a link').toBeTruthy()
    expect(mail).toContain('Hello Dr Ada Okonkwo')

    // The invited person, on a phone-width screen and another browser context.
    const person = await freshPage(360)
    await person.goto(link!)
    await person.getByTestId('password-rules').waitFor(WAIT)
    await expect.poll(() => new URL(person.url()).hash).toBe('')
    await person.getByTestId('set-password-password').locator('input').fill('short')
    await person.getByTestId('set-password-confirm').locator('input').fill('short')
    await person.getByTestId('set-password-submit').click()
    await expect.poll(() => person.getByTestId('set-password-password').innerText(), WAIT).toContain('at least 12 characters')

    await person.getByTestId('set-password-password').locator('input').fill('lanterns along the estuary path')
    await person.getByTestId('set-password-confirm').locator('input').fill('lanterns along the estuary path')
    await person.getByTestId('set-password-submit').click()
    await person.getByTestId('set-password-done').waitFor(WAIT)
    await person.getByTestId('set-password-sign-in').click()
    await expect.poll(() => person.getByTestId('sign-in-email').locator('input').inputValue(), WAIT).toBe(email)
    await person.getByTestId('sign-in-password').locator('input').fill('lanterns along the estuary path')
    await person.getByTestId('sign-in-submit').click()

    await expect.poll(() => person.getByRole('heading', { name: /Dr Ada Okonkwo/ }).isVisible(), WAIT).toBe(true)

    // Back on the admin screen the account is no longer "invited".
    await admin.goto(`${demo.server.url}/admin/accounts`)
    await admin.getByTestId('account-search').locator('input').fill('Okonkwo')
    await expect.poll(() => admin.getByTestId('account-table').innerText(), WAIT).toMatch(/Dr Ada Okonkwo[\s\S]*Active/)
    await admin.context().close()
    await person.context().close()
  })

  it('"Forgot password?" leads to a request form that answers neutrally', async () => {
    const page = await freshPage(360)
    await page.goto(`${demo.server.url}/sign-in`)

    await page.getByTestId('sign-in-forgot').click()
    await page.getByTestId('password-reset-email').locator('input').fill('nobody@saltmarsh.test')
    await page.getByTestId('password-reset-submit').click()

    await expect.poll(() => page.getByTestId('password-reset-confirmation').innerText().catch(() => ''), WAIT).toContain('If an active account uses this address')
    await page.context().close()
  })
})
