import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchChromium, signInAs, startDemoServer } from './browser.ts'

let browser: Browser

beforeAll(async () => {
  browser = await launchChromium()
})

afterAll(async () => {
  await browser?.close()
})

// The service worker downloads the whole precache before it activates: allow more than expect.poll's 1 s.
const WAIT = { timeout: 20_000 }

async function phonePage() {
  const context = await browser.newContext({ viewport: { width: 360, height: 740 }, isMobile: true, hasTouch: true })
  return context.newPage()
}

async function waitForServiceWorkerControl(page: Page) {
  await page.evaluate(() => navigator.serviceWorker.ready)
  await expect.poll(() => page.evaluate(() => navigator.serviceWorker.controller !== null), WAIT).toBe(true)
}

/** Paths of everything in the service worker's caches. */
function cachedPaths(page: Page) {
  return page.evaluate(async () => {
    const paths: string[] = []
    for (const name of await caches.keys()) {
      for (const request of await (await caches.open(name)).keys()) paths.push(new URL(request.url).pathname)
    }
    return paths
  })
}

describe('the installable app shell in Chromium', () => {
  it('links a manifest with our name, colours and 192, 512 and maskable icons', async () => {
    const server = await startDemoServer()
    try {
      const page = await phonePage()

      await page.goto(`${server.url}/sign-in`)

      const href = await page.locator('link[rel="manifest"]').getAttribute('href')
      const manifest = await page.evaluate((url) => fetch(url).then((r) => r.json()), href ?? '')
      expect(manifest).toMatchObject({ short_name: 'Plumbline', start_url: '/', display: 'standalone', theme_color: '#1F5C63' })
      const icons = manifest.icons.map((icon: { sizes: string; purpose: string }) => `${icon.sizes} ${icon.purpose}`)
      expect(icons).toEqual(['192x192 any', '512x512 any', '512x512 maskable'])
      await page.context().close()
    } finally {
      await server.close()
    }
  })

  it('precaches index.html, the lazy route chunks and only the woff2 fonts, and never an API answer', async () => {
    const server = await startDemoServer()
    try {
      const page = await phonePage()
      await signInAs(page, server.url, 'resident@saltmarsh.test')
      await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe('/')

      await waitForServiceWorkerControl(page)

      const cached = await cachedPaths(page)
      expect(cached).toContain('/index.html')
      expect(cached.filter((path) => /\/materialdesignicons-webfont-[\w-]+\.woff2$/.test(path))).toHaveLength(1)
      expect(cached.some((path) => /\/roboto-latin-500-normal-[\w-]+\.woff2$/.test(path))).toBe(true)
      expect(cached.filter((path) => /\.(ttf|eot|woff)$/.test(path))).toEqual([])
      for (const view of ['BedsideView', 'ExamLogView', 'AboutView']) {
        expect(cached.some((path) => path.startsWith(`/assets/${view}-`)), view).toBe(true)
      }
      expect(cached.filter((path) => path.startsWith('/api'))).toEqual([])
      await page.context().close()
    } finally {
      await server.close()
    }
  })

  it('the service worker replays no pushes itself: the app’s outbox is the one retry path', async () => {
    const server = await startDemoServer()
    try {
      const page = await phonePage()
      await signInAs(page, server.url, 'resident@saltmarsh.test')
      await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe('/')
      await waitForServiceWorkerControl(page)

      const script = await page.evaluate(() => fetch(navigator.serviceWorker.controller!.scriptURL).then((r) => r.text()))

      expect(script).toContain('precacheAndRoute')
      expect(script).not.toMatch(/BackgroundSync|sync\\?\/push/)
      await page.context().close()
    } finally {
      await server.close()
    }
  })

  it('"This device" shows the version, the network and what the browser says about storage', async () => {
    const server = await startDemoServer()
    try {
      const page = await phonePage()
      await signInAs(page, server.url, 'educator@saltmarsh.test')
      await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe('/')

      await page.goto(`${server.url}/device`)

      await expect.poll(() => page.getByTestId('device-version').textContent(), WAIT).toContain('0.1.0')
      expect(await page.getByTestId('device-network').textContent()).toContain('Online')
      await expect.poll(() => page.getByTestId('storage-estimate').textContent(), WAIT).toMatch(/used/)
      expect(await page.getByTestId('storage-persistence').textContent()).toMatch(/^(Granted|Not granted)/)
      await page.context().close()
    } finally {
      await server.close()
    }
  })

  it('after one online visit, opens from the cache once the server is gone', async () => {
    const server = await startDemoServer()
    let stopped = false
    try {
      const page = await phonePage()
      await signInAs(page, server.url, 'resident@saltmarsh.test')
      await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe('/')
      await waitForServiceWorkerControl(page)

      // setOffline does not stop the service worker's own fetches (microsoft/playwright#2311): stop the server itself.
      await server.close()
      stopped = true
      await page.reload()

      // Signed out (no server to refresh the session) or still signed in from the local profile: either is the app, not an error page.
      const appScreen = page.getByTestId('sign-in-email').or(page.getByRole('heading', { name: /^Welcome/ }))
      await expect.poll(() => appScreen.isVisible(), WAIT).toBe(true)
      expect(await page.title()).toMatch(/^(Sign in|Home) · Plumbline$/)
      // Both reject with a NetworkError when a font is missing from the precache.
      const faces = await page.evaluate(async () => ({
        icons: (await document.fonts.load('24px "Material Design Icons"')).length,
        roboto: (await document.fonts.load('500 16px Roboto', 'Plumbline')).length,
      }))
      expect(faces.icons).toBeGreaterThan(0)
      expect(faces.roboto).toBeGreaterThan(0)
      await page.goto(`${server.url}/no-such-page`)
      await expect.poll(() => page.getByRole('heading', { name: 'Page not found' }).isVisible(), WAIT).toBe(true)
      await page.context().close()
    } finally {
      if (!stopped) await server.close()
    }
  })
})
