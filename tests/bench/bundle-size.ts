// Prints what a first visit downloads (gzip) against its budget and what each lazily loaded route adds. Run: npm run bench:bundle
import { existsSync, readFileSync } from 'node:fs'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { gzipSync } from 'node:zlib'

interface ManifestChunk {
  file: string
  src?: string
  isEntry?: boolean
  isDynamicEntry?: boolean
  imports?: string[]
  dynamicImports?: string[]
  css?: string[]
}
type Manifest = Record<string, ManifestChunk>

const BUDGET_KB = { js: 180, css: 80 }
const dist = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../dist/client')
const manifestPath = path.join(dist, '.vite', 'manifest.json')

function gzipKb(file: string): number {
  return gzipSync(readFileSync(path.join(dist, file))).length / 1024
}

/** The chunk and everything it imports statically, which the browser fetches before running it. */
function staticClosure(manifest: Manifest, key: string, seen = new Set<string>()): Set<string> {
  if (seen.has(key)) return seen
  seen.add(key)
  for (const imported of manifest[key]?.imports ?? []) staticClosure(manifest, imported, seen)
  return seen
}

function sizeOf(manifest: Manifest, keys: Iterable<string>) {
  const chunks = [...keys].map((key) => manifest[key]!)
  const js = chunks.reduce((sum, chunk) => sum + gzipKb(chunk.file), 0)
  const cssFiles = new Set(chunks.flatMap((chunk) => chunk.css ?? []))
  const css = [...cssFiles].reduce((sum, file) => sum + gzipKb(file), 0)
  return { js, css, files: chunks.length + cssFiles.size }
}

const kb = (value: number) => `${value.toFixed(1).padStart(7)} KB`
const row = (label: string, size: { js: number; css: number; files: number }) =>
  console.log(`${label.padEnd(44)} JS ${kb(size.js)}   CSS ${kb(size.css)}   ${String(size.files).padStart(2)} files`)

/**
 * The entry, what it imports statically, and what it imports dynamically as it starts (src/main.ts loads the app in
 * stages, each a dynamic import of its own): every first visit loads all of it. The routes are imported elsewhere.
 */
function firstVisitOf(manifest: Manifest, entryKey: string): Set<string> {
  const keys = staticClosure(manifest, entryKey)
  for (const started of manifest[entryKey]!.dynamicImports ?? []) staticClosure(manifest, started, keys)
  return keys
}

/** The one stylesheet of a build without CSS code splitting, which index.html links in its head. */
function sharedStylesheet(manifest: Manifest): number {
  const file = manifest['style.css']?.file
  return file ? gzipKb(file) : 0
}

function report(manifest: Manifest) {
  const entryKey = Object.keys(manifest).find((key) => manifest[key]!.isEntry)
  if (!entryKey) throw new Error('The manifest has no entry chunk')
  const firstVisit = firstVisitOf(manifest, entryKey)
  const first = sizeOf(manifest, firstVisit)
  const stylesheet = sharedStylesheet(manifest)
  if (stylesheet) Object.assign(first, { css: first.css + stylesheet, files: first.files + 1 })
  console.log('Bundle size, gzip (node:zlib, default level)\n')
  row(`First visit: ${entryKey} + what it loads at start`, first)
  console.log('\nLazily loaded routes (chunk + static imports not already loaded):')
  const lazy = Object.keys(manifest).filter((key) => manifest[key]!.isDynamicEntry)
  const sizes = lazy.map((key) => {
    const own = [...staticClosure(manifest, key)].filter((k) => !firstVisit.has(k))
    return { key, size: sizeOf(manifest, own) }
  })
  for (const { key, size } of sizes.sort((a, b) => b.size.js - a.size.js)) row(`  ${manifest[key]!.src ?? key}`, size)
  const eagerViews = [...firstVisit].filter((key) => key.startsWith('src/views/'))
  console.log(`\nViews in the first visit: ${eagerViews.length ? eagerViews.join(', ') : 'none (every route is lazy)'}`)
  for (const kind of ['js', 'css'] as const) {
    const verdict = first[kind] <= BUDGET_KB[kind] ? 'PASS' : 'FAIL'
    console.log(`first visit ${kind.toUpperCase()} ≤ ${BUDGET_KB[kind]} KB gzip: ${verdict} (${first[kind].toFixed(1)} KB)`)
  }
}

if (!existsSync(manifestPath)) {
  console.error(`No ${path.relative(process.cwd(), manifestPath)}: run "vite build" with build.manifest enabled first.`)
  process.exit(1)
}
report(JSON.parse(readFileSync(manifestPath, 'utf8')) as Manifest)
