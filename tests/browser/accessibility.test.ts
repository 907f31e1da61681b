import { readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { url } from '@nuxt/test-utils/e2e'
import type { BrowserContext } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { call, demo, signIn } from '../support/api'
import { launchChromium } from '../support/chromium'
import { useBuiltServer } from '../support/server'

/**
 * axe-core on every main page, as each kind of visitor sees it: no serious or critical violation. axe runs
 * inside the real page after it has settled (client-only charts and previews drawn), with its source handed
 * to the page through the DevTools protocol, so the page's own content security policy is left as it is.
 */
const axeSource = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8')

interface Violation { id: string, impact: string | null, help: string, nodes: { target: unknown[], failureSummary?: string }[] }

/** The page's serious and critical violations, one readable line per rule and element. */
async function seriousViolations(context: BrowserContext, path: string): Promise<string[]> {
  const page = await context.newPage()
  try {
    const response = await page.goto(url(path), { waitUntil: 'networkidle' })
    expect(response?.status(), path).toBe(200)
    await page.locator('h1').first().waitFor()
    await page.evaluate(axeSource)
    const violations = await page.evaluate(async () => {
      const axe = (window as unknown as { axe: { run: (ctx: Document, o: object) => Promise<{ violations: Violation[] }> } }).axe
      const result = await axe.run(document, { resultTypes: ['violations'], runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'best-practice'] } })
      return result.violations
    }) as Violation[]
    return violations
      .filter(v => v.impact === 'serious' || v.impact === 'critical')
      .flatMap(v => v.nodes.map(n => `${path} — ${v.impact} ${v.id}: ${v.help} — at ${JSON.stringify(n.target)}${n.failureSummary ? ` (${n.failureSummary.replace(/\s+/g, ' ')})` : ''}`))
  }
  finally {
    await page.close()
  }
}

describe('accessibility of the main pages (axe-core)', async () => {
  await useBuiltServer()
  let browser: Awaited<ReturnType<typeof launchChromium>>
  const cookies: Record<string, string> = {}
  let specifierRef = ''
  let deskRef = ''

  beforeAll(async () => {
    browser = await launchChromium()
    const [specifier, officer, manager, admin] = await Promise.all([demo.specA, demo.officer, demo.manager, demo.admin].map(e => signIn(e)))
    Object.assign(cookies, { specifier, officer, manager, admin })
    specifierRef = (await call('/api/my/enquiries', { cookie: specifier })).body.enquiries[0].ref
    deskRef = (await call('/api/enquiries?pageSize=5', { cookie: officer })).body.enquiries[0].ref
  })
  afterAll(async () => { await browser?.close() })

  /** The browser carrying the session of `who` (none for the public). */
  async function visitAs(who?: string): Promise<BrowserContext> {
    const context = browser.context
    await context.clearCookies()
    if (who) {
      const [name, value] = cookies[who]!.split(';')[0]!.split('=') as [string, string]
      await context.addCookies([{ name, value, url: url('/'), httpOnly: true, secure: true, sameSite: 'Lax' }])
    }
    return context
  }

  const pages: { who?: string, paths: () => string[] }[] = [
    { paths: () => ['/', '/library', '/library/D-WIN-03', '/enquire', '/sign-in'] },
    { who: 'specifier', paths: () => ['/my-enquiries', `/my-enquiries/${specifierRef}`] },
    { who: 'officer', paths: () => ['/desk', `/desk/${deskRef}`, '/workbench', '/workbench/u-value', '/workbench/condensation', '/workbench/mould', '/workbench/junctions', '/workbench/strength', '/workbench/wind', '/workbench/quantities', '/workbench/quotation'] },
    { who: 'manager', paths: () => ['/desk/price-book', '/desk/targets', '/turnaround'] },
    { who: 'admin', paths: () => ['/admin'] },
  ]

  it.each(pages.map(p => [p.who ?? 'public', p] as const))('has no serious or critical violation on the pages the %s sees', async (_, { who, paths }) => {
    const context = await visitAs(who)
    const found: string[] = []
    for (const path of paths()) found.push(...await seriousViolations(context, path))
    expect(found, `\n${found.join('\n')}\n`).toEqual([])
  }, 180_000)
})
