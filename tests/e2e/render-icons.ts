// Draws the app icons in public/ from public/pwa-icon.svg with Chromium. Run after changing the SVG:
//   npx tsx tests/e2e/render-icons.ts
import { readFileSync } from 'node:fs'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { launchChromium } from './browser.ts'

const publicDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../public')
const svg = readFileSync(path.join(publicDir, 'pwa-icon.svg')).toString('base64')
const BRAND = '#1F5C63'

interface Icon {
  file: string
  size: number
  /** Full-bleed square with the mark shrunk into the safe zone (maskable: a circle of 40 % radius; iOS rounds its own corners). */
  fullBleed: boolean
}

const icons: Icon[] = [
  { file: 'pwa-192x192.png', size: 192, fullBleed: false },
  { file: 'pwa-512x512.png', size: 512, fullBleed: false },
  { file: 'maskable-icon-512x512.png', size: 512, fullBleed: true },
  { file: 'apple-touch-icon.png', size: 180, fullBleed: true },
]

function html({ size, fullBleed }: Icon) {
  const scale = fullBleed ? 0.82 : 1
  const inset = (size * (1 - scale)) / 2
  return `<body style="margin:0;background:${fullBleed ? BRAND : 'transparent'}">
    <img src="data:image/svg+xml;base64,${svg}" style="position:absolute;left:${inset}px;top:${inset}px;width:${size * scale}px;height:${size * scale}px">
  </body>`
}

const browser = await launchChromium()
try {
  for (const icon of icons) {
    const page = await browser.newPage({ viewport: { width: icon.size, height: icon.size } })
    await page.setContent(html(icon))
    await page.screenshot({ path: path.join(publicDir, icon.file), omitBackground: !icon.fullBleed })
    await page.close()
    console.log(`public/${icon.file} (${icon.size}×${icon.size})`)
  }
} finally {
  await browser.close()
}
