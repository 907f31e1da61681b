// Lighthouse on the public library page and the officers' desk: performance and accessibility scores, on a
// phone (Lighthouse's default: emulated mid-range phone, simulated slow 4G) and on a desktop.
//   npx tsx bench/lighthouse.ts
// Uses perpend_bench (100,000 enquiries, so the desk shows a full queue) and the built server; the desk is
// opened signed in as an officer (the session cookie goes with every request). Reports go to
// test-output/lighthouse/. Goal: 90 or more for both scores.
import { mkdirSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { performance } from 'node:perf_hooks'
import * as chromeLauncher from 'chrome-launcher'
import lighthouse from 'lighthouse'
import desktopConfig from 'lighthouse/core/config/desktop-config.js'
import { ensureBenchData, root, startBenchServer } from './support'

const outDir = join(root, 'test-output', 'lighthouse')
mkdirSync(outDir, { recursive: true })

await ensureBenchData()
const { base, cookie, stop } = await startBenchServer('officer@corrstone.example')
const chrome = await chromeLauncher.launch({
  chromePath: '/usr/bin/chromium',
  chromeFlags: ['--headless=new', '--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
})

const targets: { name: string, path: string, headers: Record<string, string> }[] = [
  { name: 'library', path: '/library', headers: {} },
  { name: 'desk', path: '/desk', headers: { Cookie: cookie } },
]
const formFactors = [
  { name: 'phone', config: undefined },
  { name: 'desktop', config: desktopConfig },
]

// A server that has been up a while: the library is read and indexed on its first request (reported here,
// not left inside the first page's score), and each page has been rendered once.
for (const t of targets) {
  const started = performance.now()
  const res = await fetch(`${base}${t.path}`, { headers: t.headers })
  await res.text()
  console.log(`first request to ${t.path} after start-up: ${res.status} in ${(performance.now() - started).toFixed(0)} ms`)
}

const score = (s: number | null | undefined) => (s === null || s === undefined ? '—' : String(Math.round(s * 100)))
const lows: string[] = []
try {
  console.log(`\nLighthouse ${(await import('lighthouse/package.json', { with: { type: 'json' } })).default.version} with Debian's Chromium against ${base}\n`)
  console.log('page'.padEnd(10), 'device'.padEnd(9), 'performance'.padStart(12), 'accessibility'.padStart(14), '  LCP ms', '  TBT ms', '   CLS')
  for (const t of targets) {
    for (const f of formFactors) {
      const result = await lighthouse(`${base}${t.path}`, {
        port: chrome.port,
        output: ['html', 'json'],
        onlyCategories: ['performance', 'accessibility'],
        extraHeaders: t.headers,
        logLevel: 'error',
      }, f.config)
      if (!result) throw new Error(`Lighthouse gave no result for ${t.path}`)
      const { lhr } = result
      const [html, json] = result.report as string[]
      writeFileSync(join(outDir, `${t.name}-${f.name}.report.html`), html!)
      writeFileSync(join(outDir, `${t.name}-${f.name}.report.json`), json!)
      const perf = lhr.categories.performance?.score
      const a11y = lhr.categories.accessibility?.score
      const audit = (id: string) => lhr.audits[id]?.numericValue
      console.log(t.name.padEnd(10), f.name.padEnd(9), score(perf).padStart(12), score(a11y).padStart(14),
        (audit('largest-contentful-paint')?.toFixed(0) ?? '—').padStart(8), (audit('total-blocking-time')?.toFixed(0) ?? '—').padStart(8),
        (audit('cumulative-layout-shift')?.toFixed(3) ?? '—').padStart(7))
      if (lhr.runWarnings.length) console.log(`  warnings: ${lhr.runWarnings.join(' | ')}`)
      if ((perf ?? 0) < 0.9 || (a11y ?? 0) < 0.9) lows.push(`${t.name} (${f.name})`)
      // What held the accessibility score down, so the report is not the only place to find it.
      for (const ref of lhr.categories.accessibility?.auditRefs ?? []) {
        const a = lhr.audits[ref.id]
        if (ref.weight > 0 && a && a.score !== null && a.score < 1) console.log(`  accessibility: ${a.id} — ${a.title}`)
      }
    }
  }
  console.log(`\nReports: ${outDir}`)
  console.log(lows.length ? `Below 90: ${lows.join(', ')}.` : 'Goal met: 90 or more for performance and accessibility on both pages.')
}
finally {
  await chrome.kill()
  stop()
}
