import { existsSync, readdirSync, readFileSync } from 'node:fs'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { brotliDecompressSync, gunzipSync } from 'node:zlib'
import { describe, expect, it } from 'vitest'

// What `npm run build` leaves in dist/client for the first visit (run the build first, as for every e2e file).
const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..')
const client = path.join(root, 'dist/client')
const assets = readdirSync(path.join(client, 'assets'))
const read = (file: string) => readFileSync(path.join(client, file))
const stylesheets = assets.filter((file) => file.endsWith('.css')).map((file) => read(`assets/${file}`).toString())
const ICON_RULE = /\.(mdi-[a-z0-9-]+):{1,2}before\{content:/g

function iconNamesInSources(): Set<string> {
  const files = ['src', 'shared'].flatMap((dir) =>
    readdirSync(path.join(root, dir), { recursive: true, encoding: 'utf8' })
      .filter((file) => /\.(vue|ts)$/.test(file))
      .map((file) => path.join(root, dir, file)),
  )
  return new Set(files.flatMap((file) => readFileSync(file, 'utf8').match(/\bmdi-[a-z0-9]+(?:-[a-z0-9]+)*/g) ?? []))
}

describe('the built client', () => {
  it('has a brotli and a gzip copy beside index.html and every script and stylesheet of 1 KB or more, unpacking to the same bytes', () => {
    const scripts = assets.filter((file) => /\.(js|css)$/.test(file)).map((file) => `assets/${file}`)
    const text = ['index.html', ...scripts.filter((file) => read(file).length >= 1024)]

    for (const file of text) {
      expect(existsSync(path.join(client, `${file}.br`)), `${file}.br`).toBe(true)
      expect(existsSync(path.join(client, `${file}.gz`)), `${file}.gz`).toBe(true)
    }
    expect(brotliDecompressSync(read('index.html.br')).equals(read('index.html'))).toBe(true)
    expect(gunzipSync(read('index.html.gz')).equals(read('index.html'))).toBe(true)
  })

  it('has the icon rule of every mdi-… name the sources write, and not the thousands of others', () => {
    const built = new Set(stylesheets.flatMap((css) => [...css.matchAll(ICON_RULE)].map((match) => match[1]!)))

    for (const name of iconNamesInSources()) expect(built, name).toContain(name)
    expect(built.has('mdi-abacus')).toBe(false)
    expect(built.size).toBeLessThan(300)
  })

  it('declares no icon font in a stylesheet (it loads after the first page) and ships only its woff2 copy', () => {
    expect(stylesheets.some((css) => /@font-face\{[^}]*Material Design Icons/.test(css))).toBe(false)
    expect(assets.filter((file) => file.startsWith('materialdesignicons-webfont'))).toEqual([
      expect.stringMatching(/^materialdesignicons-webfont-[\w-]+\.woff2$/),
    ])
  })

  it('ships Roboto in Latin and Latin Extended only, at 400, 500 and 700, each face with font-display: swap', () => {
    const roboto = assets.filter((file) => file.startsWith('roboto-'))
    const faces = stylesheets.flatMap((css) => css.match(/@font-face\{[^}]*Roboto[^}]*\}/g) ?? [])

    expect(roboto.length).toBeGreaterThan(0)
    for (const file of roboto) expect(file).toMatch(/^roboto-latin(-ext)?-(400|500|700)-normal-[\w-]+\.woff2?$/)
    expect(faces).toHaveLength(6)
    for (const face of faces) expect(face).toContain('font-display:swap')
  })

  it('index.html preloads the Latin Roboto 400 woff2 the stylesheet names', () => {
    const html = read('index.html').toString()

    const preload =
      /<link rel="preload" as="font" type="font\/woff2" href="\/assets\/(roboto-latin-400-normal-[\w-]+\.woff2)" crossorigin/.exec(html)
    expect(preload, 'the preload link').not.toBeNull()
    expect(assets).toContain(preload![1])
    expect(stylesheets.some((css) => css.includes(preload![1]!))).toBe(true)
  })
})
