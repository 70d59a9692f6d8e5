import { describe, it } from 'vitest'
import { WAIT, type Tab } from './axe-audit.ts'
import { auditScreens, go, tabFor, type Screen } from './axe-screens.ts'
import { useDemoBrowser } from './browser.ts'

const demo = useDemoBrowser()
// Each test walks its screens in four looks on a busy machine; a page only takes this long when something is wrong.
const LONG = 240_000

const signIn: Screen = { name: 'sign-in', open: (tab) => go(tab, '/sign-in'), ready: '[data-testid=sign-in-submit]' }

/** The first link in `container`, as a path. */
async function firstLink({ page }: Tab, container: string, prefix: string): Promise<string> {
  return (await page.locator(`${container} a[href^="${prefix}"]`).first().getAttribute('href', WAIT))!
}

const ATTENDING: Screen[] = [
  { name: 'sign-off queue', open: (tab) => go(tab, '/signoff'), ready: '[data-testid=signoff-table] a[href^="/signoff/"]' },
  {
    name: 'exam review',
    open: async (tab) => go(tab, await firstLink(tab, '[data-testid=signoff-table]', '/signoff/')),
    ready: '[data-testid=exam-version]',
  },
  { name: 'agreement', open: (tab) => go(tab, '/agreement'), ready: '[data-testid=bland-altman-caption]' },
  { name: 'rounds', open: (tab) => go(tab, '/rounds'), ready: '[data-testid=rounds-list], [data-testid=rounds-empty]' },
  {
    name: 'round detail',
    open: async (tab) => {
      const testid = await tab.page.locator('[data-testid^="round-item-"]').first().getAttribute('data-testid', WAIT)
      await go(tab, `/rounds/${testid!.replace('round-item-', '')}`)
    },
    ready: '[data-testid=round-title]',
  },
]

const ADMIN: Screen[] = [
  { name: 'accounts', open: (tab) => go(tab, '/admin/accounts'), ready: '[data-testid=account-name]' },
  { name: 'settings', open: (tab) => go(tab, '/admin/settings'), ready: '[data-testid=settings-current]' },
]

describe.concurrent('accessibility in Chromium (axe-core), on a phone and a desktop, in the light and the dark theme', () => {
  it(
    'the sign-in page has no serious or critical violation and one h1',
    async ({ expect }) => {
      const tab = await tabFor(expect, demo.browser, demo.server.url)

      expect(await auditScreens(tab, [signIn])).toEqual([])
    },
    LONG,
  )

  it(
    'the sign-off queue, an exam under review, agreement, rounds and a round have none, as the attending sees them',
    async ({ expect }) => {
      const tab = await tabFor(expect, demo.browser, demo.server.url, 'attending@saltmarsh.test')

      expect(await auditScreens(tab, ATTENDING)).toEqual([])
    },
    LONG,
  )

  it(
    'accounts and settings have none, as the admin sees them',
    async ({ expect }) => {
      const tab = await tabFor(expect, demo.browser, demo.server.url, 'admin@saltmarsh.test')

      expect(await auditScreens(tab, ADMIN)).toEqual([])
    },
    LONG,
  )
})
