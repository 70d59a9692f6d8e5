// Screenshots of the demo for the README, on a phone: `npm run build`, then `npm run screenshots [name…]`.
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import type { Page } from 'playwright-core'
import { loadConfig } from '../../server/config.ts'
import { startServer } from '../../server/index.ts'
import { launchChromium, signInAs } from './browser.ts'

const OUT_DIR = path.resolve('public/screenshots')
const RESIDENT = 'resident@saltmarsh.test'
const WAIT = { timeout: 30_000 }

/** Each picture: the screen it shows, and what is on it once its data is in. */
const SHOTS: Record<string, { path: string; ready: string }> = {
  'quick-exam': { path: '/record?mode=quick', ready: 'main h1' },
  home: { path: '/', ready: '[data-testid=caution-note]' },
  'exam-log': { path: '/exams', ready: ':is([data-testid=exam-table], [data-testid=exam-list]) a[href^="/exams/"]' },
}

async function settle(page: Page, ready: string) {
  await page
    .locator(ready)
    .first()
    .waitFor({ state: 'visible', ...WAIT })
  const loading = '[role=progressbar]:not([aria-valuenow]):visible, .v-skeleton-loader:visible, .v-data-table-rows-loading:visible'
  await page
    .locator(loading)
    .first()
    .waitFor({ state: 'detached', ...WAIT })
  // The icon font is added once the page is idle (src/plugins/icon-font.ts): wait until it has loaded too.
  await page.waitForFunction(() => [...document.fonts].some((f) => f.family.includes('Material Design Icons') && f.status === 'loaded'), undefined, WAIT)
  await page.evaluate('document.fonts.ready.then(() => true)')
}

async function take(page: Page, baseUrl: string, name: string) {
  const shot = SHOTS[name]
  if (!shot) throw new Error(`No screenshot named ${name}; known: ${Object.keys(SHOTS).join(', ')}`)
  await page.goto(`${baseUrl}${shot.path}`)
  await settle(page, shot.ready)
  await page.screenshot({ path: path.join(OUT_DIR, `${name}.png`), animations: 'disabled', caret: 'hide' })
  console.log(`public/screenshots/${name}.png`)
}

async function main(names: string[]) {
  // A fresh data folder, migrated and seeded with the demo hospital by the server itself.
  const dataDir = mkdtempSync(path.join(tmpdir(), 'plumbline-screenshots-'))
  const server = await startServer(loadConfig({ PORT: '0', DATA_DIR: dataDir, DEMO: 'true', LOG_LEVEL: 'silent' }))
  const browser = await launchChromium()
  try {
    const context = await browser.newContext({
      viewport: { width: 390, height: 844 },
      deviceScaleFactor: 2,
      isMobile: true,
      hasTouch: true,
    })
    const page = await context.newPage()
    await signInAs(page, server.url, RESIDENT)
    await page.waitForURL(`${server.url}/`, WAIT)
    mkdirSync(OUT_DIR, { recursive: true })
    for (const name of names) await take(page, server.url, name)
  } finally {
    await browser.close()
    await server.close()
    rmSync(dataDir, { recursive: true, force: true })
  }
}

await main(process.argv.length > 2 ? process.argv.slice(2) : Object.keys(SHOTS))
