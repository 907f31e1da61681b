import { join } from 'node:path'
import { url } from '@nuxt/test-utils/e2e'
import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { call, callForm, demo, signIn as apiSignIn } from '../support/api'
import { launchChromium, screenshotDir, signInPage } from '../support/chromium'
import { makePdf, tinyPng } from '../support/files'
import { useBuiltServer } from '../support/server'

/**
 * The pages in real Chromium under the Content-Security-Policy: every main page works with no policy violation,
 * and script smuggled into enquiries (markdown, project fields, names, file names) never runs where officers
 * and requesters read it.
 */

// Each payload would set window.__xss (or open a dialog) if it ever ran.
const payloads = [
  '<script>window.__xss = "script"</script>',
  '<img src="x" onerror="window.__xss = \'img\'; alert(1)">',
  '[a markdown link](javascript:window.__xss=\'md-link\')',
  '<a href="javascript:window.__xss=\'a-href\'">a raw link</a>',
  '<svg onload="window.__xss = \'svg\'"></svg>',
  '"><script>window.__xss = "attr-break"</script>',
  '<iframe srcdoc="<script>parent.__xss = \'iframe\'</script>"></iframe>',
  '<details open ontoggle="window.__xss = \'toggle\'">x</details>',
  '![pic](x" onerror="window.__xss=\'md-img\')',
]
const marker = 'Hostile markup check'

interface Watch { violations: string[], dialogs: string[], errors: string[] }

function watch(page: Page): Watch {
  const seen: Watch = { violations: [], dialogs: [], errors: [] }
  page.on('console', (m) => {
    const text = m.text()
    if (text.startsWith('csp-violation ') || /Content Security Policy/i.test(text)) seen.violations.push(`${page.url()}: ${text}`)
  })
  page.on('pageerror', e => seen.errors.push(`${page.url()}: ${e.message}`))
  page.on('dialog', (d) => {
    seen.dialogs.push(`${page.url()}: ${d.message()}`)
    void d.dismiss()
  })
  return seen
}

describe('pages in Chromium under the security policy', async () => {
  await useBuiltServer()
  let browser: Awaited<ReturnType<typeof launchChromium>>
  let page: Page
  let seen: Watch
  let pdfRef: string
  let hostileRef: string
  let anonymousRef: string

  beforeAll(async () => {
    // An enquiry with a PDF drawing for the preview.
    const specA = await apiSignIn(demo.specA)
    const form = new FormData()
    form.append('data', JSON.stringify({
      project: { name: 'Preview check house', region: 'Clare', stage: 'planning' },
      topic: 'other', subject: 'Drawing preview under the policy', question: 'An enquiry whose PDF drawing is previewed in the browser.', priority: 'normal',
    }))
    form.append('drawings', new Blob([new Uint8Array(await makePdf('Preview section'))]), 'preview.pdf')
    pdfRef = (await callForm('/api/enquiries', form, { cookie: specA })).body.ref

    // Every payload in the markdown question, the project fields, a reply and the file names.
    const hostile = new FormData()
    hostile.append('data', JSON.stringify({
      project: { name: `${marker} <img src=x onerror="window.__xss='project'">`, region: '<script>window.__xss="region"</script>', stage: 'planning', siteAddress: payloads[1] },
      topic: 'other', subject: `${marker} <svg onload="window.__xss='subject'">`, question: `# ${marker}\n\n${payloads.join('\n\n')}`, priority: 'normal',
    }))
    hostile.append('drawings', new Blob([tinyPng]), '<img src=x onerror="window.__xss=\'file\'">.png')
    hostile.append('drawings', new Blob([tinyPng]), '"><script>window.__xss="file2"</script>.png')
    const created = await callForm('/api/enquiries', hostile, { cookie: specA })
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    hostileRef = created.body.ref
    expect((await call(`/api/enquiries/${hostileRef}/messages`, { cookie: specA, body: { body: payloads.join('\n\n') } })).status).toBe(201)

    // From the public form: the requester's own name and firm carry the payloads to the queue.
    const anonymous = await call('/api/enquiries', {
      body: {
        requester: { name: '<img src=x onerror="window.__xss=\'name\'">', organisation: '<script>window.__xss="org"</script>', email: 'hostile@example.invalid', phone: '01 555 0199' },
        project: { name: `${marker} public`, region: 'Dublin', stage: 'planning' },
        topic: 'other', subject: `${marker} <script>window.__xss="anon-subject"</script>`, question: `${payloads.join('\n')}\n\nplus enough words to pass.`, priority: 'normal',
      },
    })
    expect(anonymous.status, JSON.stringify(anonymous.body)).toBe(201)
    anonymousRef = anonymous.body.ref

    browser = await launchChromium()
    page = await browser.context.newPage()
    await page.addInitScript(() => {
      document.addEventListener('securitypolicyviolation', e => console.error(`csp-violation ${e.violatedDirective} ${e.blockedURI} at ${e.sourceFile}:${e.lineNumber}`))
    })
    seen = watch(page)
  })
  afterAll(async () => {
    await browser?.close()
  })

  const expectCalm = async (where: string) => {
    expect(await page.evaluate(() => (window as unknown as { __xss?: string }).__xss), `${where}: a payload ran`).toBeUndefined()
    expect(seen.dialogs, where).toEqual([])
    expect(seen.violations, where).toEqual([])
    expect(seen.errors, where).toEqual([])
  }

  it('sends the policy: nonce for scripts, no unsafe-eval, no framing, no sniffing', async () => {
    const res = await fetch(url('/library'))
    const csp = res.headers.get('content-security-policy')!
    const nonce = /'nonce-([A-Za-z0-9+/=]+)'/.exec(csp)![1]!
    expect(csp).toContain(`script-src 'self' 'nonce-${nonce}'`)
    expect(csp).not.toContain('unsafe-eval')
    expect(csp).toMatch(/script-src [^;]*/)
    expect(/script-src [^;]*unsafe-inline/.test(csp)).toBe(false)
    expect(csp).toContain(`frame-ancestors 'none'`)
    expect(csp).toContain(`object-src 'none'`)
    expect(res.headers.get('x-content-type-options')).toBe('nosniff')
    expect(res.headers.get('referrer-policy')).toBe('same-origin')
    expect(res.headers.get('cross-origin-opener-policy')).toBe('same-origin')
    expect(res.headers.get('permissions-policy')).toContain('camera=()')
    expect(res.headers.get('x-powered-by')).toBeNull()
    const html = await res.text()
    // Every script tag Nuxt writes carries this response's nonce; the next response has another.
    const tags = html.match(/<script\b[^>]*>/g)!
    expect(tags.length).toBeGreaterThan(1)
    for (const tag of tags) expect(tag).toContain(`nonce="${nonce}"`)
    const again = (await fetch(url('/library'))).headers.get('content-security-policy')!
    expect(again).not.toContain(nonce)
    // Over plain HTTP, and with X-Forwarded-Proto from a proxy nobody said to trust, no HSTS.
    expect(res.headers.get('strict-transport-security')).toBeNull()
    const forwarded = await fetch(url('/'), { headers: { 'x-forwarded-proto': 'https' } })
    expect(forwarded.headers.get('strict-transport-security')).toBeNull()
    const api = await fetch(url('/api/health'))
    expect(api.headers.get('content-security-policy')).toContain(`default-src 'none'`)
    expect(api.headers.get('x-content-type-options')).toBe('nosniff')
  })

  it('public pages work with no policy violation: home, library, a library item, the enquiry form', async () => {
    for (const path of ['/', '/library', '/library/D-WIN-01', '/enquire']) {
      await page.goto(url(path), { waitUntil: 'networkidle' })
      await page.locator('main').waitFor()
    }
    await expectCalm('public pages')
  })

  it('staff pages work with no violation: the queue, an enquiry file with its PDF preview, the U-value workbench', async () => {
    await signInPage(page, demo.officer)
    await page.goto(url('/desk'), { waitUntil: 'networkidle' })
    await page.getByTestId('desk-queue').waitFor()
    await page.goto(url(`/desk/${pdfRef}`), { waitUntil: 'networkidle' })
    // The first PDF of an enquiry opens in place by itself.
    await page.getByRole('button', { name: 'Hide preview' }).waitFor()
    const canvas = page.getByTestId('pdf-canvas')
    await expect.poll(() => canvas.evaluate((c: HTMLCanvasElement) => c.width * c.height), { timeout: 20_000 }).toBeGreaterThan(0)
    await expect.poll(() => page.getByText(/Page 1 of 1/).count(), { timeout: 20_000 }).toBeGreaterThan(0)
    expect(await page.getByText('This PDF could not be shown here').count()).toBe(0)
    await page.screenshot({ path: join(screenshotDir, 'security-pdf-preview.png') })
    await page.goto(url('/workbench/u-value'), { waitUntil: 'networkidle' })
    await expect.poll(async () => (await page.getByTestId('u-value').textContent())?.trim() ?? '').toMatch(/^\d\.\d\d/)
    await expectCalm('staff pages')
  })

  it('the turnaround page draws its charts with no violation', async () => {
    await signInPage(page, demo.manager)
    await page.goto(url('/turnaround'), { waitUntil: 'networkidle' })
    await page.getByTestId('turnaround-tiles').waitFor()
    await expect.poll(() => page.locator('canvas').count(), { timeout: 20_000 }).toBeGreaterThan(0)
    await expectCalm('turnaround')
  })

  it('no payload runs in the officer\'s enquiry file or the queue', async () => {
    await signInPage(page, demo.officer)
    for (const ref of [hostileRef, anonymousRef]) {
      await page.goto(url(`/desk/${ref}`), { waitUntil: 'networkidle' })
      await page.getByText(marker).first().waitFor()
      expect(await page.locator('main script, main iframe, main [onerror], main [onload], main [ontoggle]').count()).toBe(0)
      expect(await page.locator('main a[href^="javascript:" i]').count()).toBe(0)
      // The file names are shown as the text they became, not as markup.
      if (ref === hostileRef) await page.getByText(/img src_x onerror_/).first().waitFor()
      // Clicking each link the sanitiser kept runs nothing either.
      for (const link of await page.locator('main .prose-enquiry a').all()) await link.click()
    }
    await page.screenshot({ path: join(screenshotDir, 'security-hostile-file.png'), fullPage: true })
    await page.goto(url('/desk'), { waitUntil: 'networkidle' })
    await page.getByTestId('desk-queue').waitFor()
    await page.getByText(marker).first().waitFor()
    await expectCalm('officer')
  })

  it('no payload runs on the requester\'s "my enquiries" list and file', async () => {
    await signInPage(page, demo.specA)
    await page.goto(url('/my-enquiries'), { waitUntil: 'networkidle' })
    await page.getByText(marker).first().waitFor()
    await page.goto(url(`/my-enquiries/${hostileRef}`), { waitUntil: 'networkidle' })
    await page.getByText(marker).first().waitFor()
    expect(await page.locator('main script, main iframe, main [onerror], main [onload]').count()).toBe(0)
    expect(await page.locator('main a[href^="javascript:" i]').count()).toBe(0)
    await expectCalm('requester')
  })
})
