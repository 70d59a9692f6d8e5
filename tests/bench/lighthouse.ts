// Lighthouse (mobile form factor, simulated 4G throttling) against the built app served as in production: the sign-in
// page on a first visit, and the exam log of a signed-in resident loaded cold. Prints the four category scores beside
// the goals, the paint metrics and whatever keeps accessibility or best practices from full marks. Run:
// npm run bench:lighthouse [-- /sign-in] [-- --runs=5] (builds first when dist/ is missing). Each page is audited five
// times, as Lighthouse's guidance on score variability advises (docs/variability.md in GoogleChrome/lighthouse: the
// median of five runs is about twice as stable as one): every run's performance score and their median are printed,
// then the median run in full.
import { spawnSync } from 'node:child_process'
import { existsSync, mkdtempSync, writeFileSync } from 'node:fs'
import { cpus, tmpdir } from 'node:os'
import path from 'node:path'
import { launch, type LaunchedChrome } from 'chrome-launcher'
import lighthouse from 'lighthouse'
import { computeMedianRun, filterToValidRuns } from 'lighthouse/core/lib/median-run.js'
import puppeteer from 'puppeteer-core'
import { startBenchServer } from './bench-server.ts'

const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium'
const GOALS: Record<string, number | undefined> = { performance: 90, accessibility: 95, 'best-practices': 95 }
const CATEGORIES = ['performance', 'accessibility', 'best-practices', 'seo']
const METRICS = ['first-contentful-paint', 'largest-contentful-paint', 'total-blocking-time', 'cumulative-layout-shift', 'speed-index']
const root = path.resolve(import.meta.dirname, '../..')

function buildIfNeeded() {
  if (existsSync(path.join(root, 'dist/client/index.html')) && existsSync(path.join(root, 'dist/server/index.js'))) return
  const build = spawnSync('npm', ['run', 'build'], { cwd: root, stdio: 'inherit' })
  if (build.status !== 0) throw new Error('npm run build failed')
}

/** Signs in through the API from a page of the app's origin that runs no app code, so the refresh cookie is set
 * while no service worker or cache is there yet. */
async function signInThroughApi(chrome: LaunchedChrome, baseUrl: string) {
  const browser = await puppeteer.connect({ browserURL: `http://127.0.0.1:${chrome.port}` })
  try {
    const page = await browser.newPage()
    await page.goto(`${baseUrl}/robots.txt`)
    const status = await page.evaluate(async () => {
      const body = JSON.stringify({ email: 'resident@saltmarsh.test', password: 'bedside-demo' })
      const response = await fetch('/api/auth/login', { method: 'POST', headers: { 'content-type': 'application/json' }, body })
      return response.status
    })
    if (status !== 200) throw new Error(`sign-in answered ${status}`)
    await page.close()
  } finally {
    await browser.disconnect()
  }
}

interface Page {
  label: string
  path: string
  signedIn: boolean
}

async function audit(baseUrl: string, page: Page) {
  // A fresh profile for each page: no cookie, cache or service worker carries over from the other run.
  const chrome = await launch({ chromePath: CHROMIUM, chromeFlags: ['--headless=new', '--no-sandbox', '--disable-gpu'] })
  try {
    if (page.signedIn) await signInThroughApi(chrome, baseUrl)
    const flags = { port: chrome.port, logLevel: 'error' as const, onlyCategories: CATEGORIES, disableStorageReset: page.signedIn }
    const result = await lighthouse(`${baseUrl}${page.path}`, flags)
    if (!result) throw new Error(`Lighthouse returned nothing for ${page.path}`)
    return result.lhr
  } finally {
    chrome.kill()
  }
}

type Report = Awaited<ReturnType<typeof audit>>

const reportDir = mkdtempSync(path.join(tmpdir(), 'plumbline-lighthouse-reports-'))

function print(page: Page, lhr: Report, runs: Report[]) {
  const reportFile = path.join(reportDir, `${page.path.replace(/\W+/g, '') || 'root'}.json`)
  writeFileSync(reportFile, JSON.stringify(lhr))
  console.log(`\n${page.label}: ${lhr.finalDisplayedUrl} (Lighthouse ${lhr.lighthouseVersion}; full report ${reportFile})`)
  const scores = runs.map((run) => Math.round((run.categories.performance?.score ?? 0) * 100))
  const sorted = [...scores].sort((a, b) => a - b)
  const middle = sorted.length % 2 ? sorted[(sorted.length - 1) / 2]! : (sorted[sorted.length / 2 - 1]! + sorted[sorted.length / 2]!) / 2
  console.log(`  performance in each of ${runs.length} runs: ${scores.join(', ')}`)
  const mark = (score: number, goal?: number) => (goal ? `   goal ≥ ${goal} ${score >= goal ? 'PASS' : 'FAIL'}` : '')
  console.log(`  ${'performance'.padEnd(16)} ${String(middle).padStart(3)}${mark(middle, GOALS.performance)} (median of the runs' scores)`)
  // The other categories and the metrics below are the median run's (Lighthouse's computeMedianRun: the run nearest the
  // median first contentful paint and time to interactive), whose own performance score may differ from the median.
  console.log(`  the median run (${Math.round((lhr.categories.performance?.score ?? 0) * 100)} for performance):`)
  for (const id of CATEGORIES.filter((category) => category !== 'performance')) {
    const score = Math.round((lhr.categories[id]?.score ?? 0) * 100)
    console.log(`  ${id.padEnd(16)} ${String(score).padStart(3)}${mark(score, GOALS[id])}`)
  }
  if (lhr.runtimeError) console.log(`  Lighthouse could not measure this run (${lhr.runtimeError.code}): run the bench again`)
  console.log(`    CPU benchmark index ${lhr.environment.benchmarkIndex} (Lighthouse scales task times from it)`)
  for (const id of METRICS) console.log(`    ${lhr.audits[id]?.title?.padEnd(26)} ${lhr.audits[id]?.displayValue ?? ''}`)
  const savings = Object.values(lhr.audits).filter(
    (a) => (a.metricSavings?.LCP ?? 0) + (a.metricSavings?.FCP ?? 0) > 0 && (a.score ?? 1) < 1,
  )
  for (const a of savings.slice(0, 5)) console.log(`    performance: ${a.title} ${a.displayValue ?? ''}`)
  if ((lhr.audits['cumulative-layout-shift']?.numericValue ?? 0) > 0.1)
    console.log(`    layout shifts:${examples(lhr.audits['layout-shifts']?.details)}`)
  for (const id of ['accessibility', 'best-practices', 'seo']) {
    const failing = (lhr.categories[id]?.auditRefs ?? []).filter((ref) => ref.weight > 0 && (lhr.audits[ref.id]?.score ?? 1) < 1)
    for (const ref of failing) console.log(`    ${id}: ${lhr.audits[ref.id]!.title}${examples(lhr.audits[ref.id]!.details)}`)
  }
}

/** Up to three of the elements, messages or issues an audit names, to know where to look. */
function examples(details: unknown): string {
  const items = (details as { items?: Record<string, unknown>[] } | undefined)?.items ?? []
  const text = items.slice(0, 3).map((item) => {
    const node = (item.node ?? item) as { snippet?: string; explanation?: string }
    return (
      String(node.snippet ?? item.description ?? item.issueType ?? JSON.stringify(item).slice(0, 160)) +
      (node.explanation ? ` (${node.explanation.split('\n')[1]?.trim() ?? ''})` : '')
    )
  })
  return text.map((line) => `\n      ${line.replace(/\s+/g, ' ').slice(0, 220)}`).join('')
}

const only = process.argv.slice(2).find((arg) => arg.startsWith('/'))
const RUNS = Number(process.argv.find((arg) => arg.startsWith('--runs='))?.slice('--runs='.length) ?? 5)
const PAGES: Page[] = [
  { label: 'Sign-in page, first visit', path: '/sign-in', signedIn: false },
  { label: 'Exam log, signed in (resident), cold cache', path: '/exams', signedIn: true },
]

async function auditAll(baseUrl: string) {
  console.log(`Mobile form factor, simulated throttling; ${cpus().length} CPUs (${cpus()[0]?.model}), Node ${process.version}`)
  for (const page of PAGES.filter((p) => !only || p.path === only)) {
    const runs: Report[] = []
    for (let i = 0; i < RUNS; i++) runs.push(await audit(baseUrl, page))
    // A run Lighthouse could not measure (a trace without its navigation start) is left out rather than scored 0.
    const valid = filterToValidRuns(runs)
    if (!valid.length) throw new Error(`No run of ${page.path} could be measured: ${runs[0]?.runtimeError?.message ?? ''}`)
    print(page, computeMedianRun(valid), valid)
  }
}

// LIGHTHOUSE_BASE_URL audits a server that is already running (with the demo data) instead of starting one.
const running = process.env.LIGHTHOUSE_BASE_URL
if (running) await auditAll(running)
else {
  buildIfNeeded()
  const server = await startBenchServer([path.join(root, 'dist/server/index.js')], { NODE_ENV: 'production' })
  try {
    await auditAll(server.url)
  } finally {
    await server.stop()
  }
}
