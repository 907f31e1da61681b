import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { url } from '@nuxt/test-utils/e2e'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchChromium, screenshotDir } from '../support/chromium'
import { useBuiltServer } from '../support/server'
import { pdfText } from '../support/pdf'

describe('detail library in Chromium', async () => {
  await useBuiltServer()
  let browser: Awaited<ReturnType<typeof launchChromium>>
  beforeAll(async () => { browser = await launchChromium() })
  afterAll(async () => { await browser?.close() })

  it('lets a visitor search as they type, open a detail and download its sheet as a PDF', async () => {
    const page = await browser.context.newPage()
    await page.goto(url('/library'), { waitUntil: 'networkidle' })
    await expect(page.locator('h1').innerText()).resolves.toBe('Detail library')
    // The whole library is listed two dozen at a time; more on request.
    const results = page.getByTestId('library-results').locator('li')
    await expect(results.count()).resolves.toBe(24)
    await page.getByTestId('library-more').click()
    await expect.poll(() => results.count()).toBe(48)

    // Typing, with no Enter: the results follow the words and the URL keeps them.
    await page.getByLabel('Search').pressSequentially('window jamb', { delay: 30 })
    await page.waitForURL(/[?&]q=window(\+|%20)jamb/)
    await page.getByTestId('result-count').filter({ hasText: '“window jamb”' }).waitFor()
    // Two details are window jambs (D-WIN-03 and D-WIN-04); both lead the list.
    const leading = (await page.getByTestId('library-results').locator('li').allInnerTexts()).slice(0, 2).join(' ')
    expect(leading).toContain('D-WIN-03')
    expect(leading).toContain('D-WIN-04')

    // A filter narrows the list and is kept in the URL too.
    await page.getByLabel('Kind').selectOption('clauses')
    await page.waitForURL(/collection=clauses/)
    await page.getByTestId('library-results').locator('li').first().filter({ hasText: 'Specification clauses' }).waitFor()
    const kinds = await page.getByTestId('library-results').locator('li').allInnerTexts()
    expect(kinds.every(t => /specification clauses/i.test(t))).toBe(true)
    await page.getByLabel('Kind').selectOption('')
    await page.waitForURL(u => !u.search.includes('collection='))

    await page.getByTestId('library-results').getByRole('link', { name: /D-WIN-03/ }).click()
    await page.waitForURL(/\/library\/D-WIN-03$/)
    await page.locator('h1', { hasText: 'Window jamb' }).waitFor()
    await expect(page.locator('h1').innerText()).resolves.toBe('Window jamb, frame at block face')
    const drawing = page.locator('figure img')
    await expect(drawing.getAttribute('src')).resolves.toBe('/library/drawings/D-WIN-03.svg')
    await expect(drawing.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0)).resolves.toBe(true)
    await expect(page.getByText('Invented demo values.').count()).resolves.toBeGreaterThan(0)
    await page.screenshot({ path: join(screenshotDir, 'library-item.png'), fullPage: true })

    const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('download-pdf').click()])
    expect(download.suggestedFilename()).toBe('D-WIN-03-rev-B.pdf')
    const path = await download.path()
    const bytes = new Uint8Array(readFileSync(path))
    expect(new TextDecoder().decode(bytes.slice(0, 5))).toBe('%PDF-')
    const text = (await pdfText(bytes)).text
    expect(text).toContain('Window jamb, frame at block face')
    expect(text).toContain('D-WIN-03')
  })

  it('opens a listed item inside the app, and leaves a Ctrl-click to the browser', async () => {
    const page = await browser.context.newPage()
    await page.goto(url('/library'), { waitUntil: 'networkidle' })
    const first = page.getByTestId('library-results').getByRole('link').first()
    const href = await first.getAttribute('href')
    expect(href).toMatch(/^\/library\/[A-Z]-[A-Z]+-\d+$/)

    // Ctrl-click: a new tab, this page stays where it is.
    const [opened] = await Promise.all([browser.context.waitForEvent('page'), first.click({ modifiers: ['Control'] })])
    await opened.waitForURL(new RegExp(`${href}$`))
    await opened.close()
    expect(new URL(page.url()).pathname).toBe('/library')

    // A plain click moves within the app: the page is not loaded again (what this window holds survives).
    await page.evaluate(() => { (window as unknown as { stayed: boolean }).stayed = true })
    await first.click()
    await page.waitForURL(new RegExp(`${href}$`))
    await page.locator('h1').waitFor()
    await expect(page.evaluate(() => (window as unknown as { stayed?: boolean }).stayed)).resolves.toBe(true)
    await page.close()
  })

  it('shows a superseded detail with a link to its successor', async () => {
    const page = await browser.context.newPage()
    await page.goto(url('/library/D-GRD-01'))
    const banner = page.getByTestId('superseded-banner')
    await expect(banner.innerText()).resolves.toContain('superseded')
    await banner.getByRole('link', { name: /D-GRD-03/ }).click()
    await page.waitForURL(/\/library\/D-GRD-03$/)
    await page.locator('h1', { hasText: 'insulated' }).waitFor()
    await expect(page.getByTestId('superseded-banner').count()).resolves.toBe(0)
  })
})
