import { join } from 'node:path'
import { fetch, url } from '@nuxt/test-utils/e2e'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchChromium, screenshotDir } from '../support/chromium'
import { useBuiltServer } from '../support/server'
import { pdfText } from '../support/pdf'

const ref3 = `TQ-${new Date().getUTCFullYear()}-0003` // seeded: the wind enquiry of Keel Structural

describe('workbench part 2 in Chromium', async () => {
  await useBuiltServer()
  let browser: Awaited<ReturnType<typeof launchChromium>>
  beforeAll(async () => { browser = await launchChromium() })
  afterAll(async () => { await browser?.close() })

  it('runs the wind page for five storeys, shows the zone counts and saves it to the wind enquiry', async () => {
    const page = await browser.context.newPage()
    const errors: string[] = []
    page.on('pageerror', e => errors.push(e.message))
    await page.goto(url('/workbench'), { waitUntil: 'networkidle' })
    await page.getByRole('link', { name: 'Wind and anchors' }).click()
    await page.waitForURL(/\/workbench\/wind$/)

    await page.getByLabel('Storeys').fill('5')
    await page.getByLabel('Storey height (m)').fill('3')
    await page.getByLabel('Facade length (m)').fill('30')
    await page.getByLabel('Building depth (m)').fill('12')
    // Hand-derived in tests/api/workbench2.test.ts (EN 1991-1-4, terrain II, vb 26 m/s, h 15 m): qp ≈ 1105 Pa,
    // 16 / 13 / 6 anchors per m² and 922 / 2996 / 432 anchors in zones A / B / C with 20 % openings.
    await expect.poll(() => page.getByTestId('qp').textContent()).toMatch(/qp = 1105 Pa at ze = 15\.0 m/)
    await expect(page.getByTestId('anchors-A').getByTestId('zone-count').textContent()).resolves.toBe('922')
    await expect(page.getByTestId('anchors-B').getByTestId('zone-count').textContent()).resolves.toBe('2996')
    await expect(page.getByTestId('anchors-C').getByTestId('zone-count').textContent()).resolves.toBe('432')
    const sketch = page.getByTestId('facade-sketch')
    await expect(sketch.locator('[data-zone="A"]').count()).resolves.toBe(2)
    await expect(sketch.getByTestId('legend-A').textContent()).resolves.toMatch(/16\/m², 922 anchors/)
    expect(await page.getByTestId('caution').innerText()).toMatch(/chartered structural engineer/)

    // A bad value is a message on the field, never NaN.
    await page.getByLabel('Storeys').fill('')
    await expect(page.getByTestId('wind-error').textContent()).resolves.toMatch(/Storeys must be a number/)
    expect(await page.locator('main').innerText()).not.toMatch(/NaN|Infinity/)
    await page.getByLabel('Storeys').fill('5')

    await page.getByLabel('E-mail').fill('officer@corrstone.example')
    await page.getByLabel('Password').fill('corrstone-demo-2026')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.getByLabel('Enquiry reference').fill(ref3)
    await page.getByRole('button', { name: 'Save calculation' }).click()
    await expect(page.getByTestId('saved').textContent()).resolves.toMatch(new RegExp(`Saved as calculation \\d+ on ${ref3}`))
    const savedId = Number((await page.getByTestId('saved').textContent())!.match(/calculation (\d+)/)![1])
    await page.screenshot({ path: join(screenshotDir, 'wind.png'), fullPage: true })

    const session = (await browser.context.cookies()).find(c => c.name === 'perpend-session')!
    const res = await fetch(`/api/enquiries/${ref3}/calculations`, { headers: { cookie: `${session.name}=${session.value}` } })
    const { calculations } = await res.json() as { calculations: { id: number, method: string, outputs: { layout: { total: number } } }[] }
    const saved = calculations.find(c => c.id === savedId)
    expect(saved?.method).toBe('wind-anchors')
    expect(saved?.outputs.layout.total).toBe(922 + 2996 + 432)
    expect(errors).toEqual([])
    await page.close()
  })

  it('builds a quotation from quantities and its PDF holds the lines and the total', async () => {
    const page = await browser.context.newPage()
    const errors: string[] = []
    page.on('pageerror', e => errors.push(e.message))
    // Signed in as the officer by the previous test (same browser context).
    await page.goto(url('/workbench/quotation'), { waitUntil: 'networkidle' })
    await page.getByLabel('Enquiry reference').fill(ref3)
    await page.getByRole('button', { name: 'Open enquiry' }).click()
    await page.waitForURL(/ref=TQ-/)
    await page.getByLabel('Scope').selectOption('full-system')
    await page.getByLabel('Gross wall area (m²)').fill('450')
    await page.getByLabel('Delivery').selectOption('DEL-Z1')
    await expect.poll(() => page.getByTestId('quote-lines').innerText()).toMatch(/Corrstone lightweight-aggregate block/)
    const total = (await page.getByTestId('quote-total').textContent())!.trim()
    expect(total).toMatch(/^€ \d+\.\d\d$/)

    await page.getByRole('button', { name: 'Save quotation revision' }).click()
    await expect(page.getByTestId('quotation-saved').textContent()).resolves.toMatch(new RegExp(`Saved revision [A-Z], total ${total.replace('.', '\\.')}`))
    const href = await page.getByTestId('quotation-pdf').getAttribute('href')
    expect(href).toMatch(new RegExp(`^/api/enquiries/${ref3}/attachments/\\d+$`))
    await expect(page.getByTestId('quotation-list').innerText()).resolves.toContain(total)
    await page.screenshot({ path: join(screenshotDir, 'quotation.png'), fullPage: true })

    const session = (await browser.context.cookies()).find(c => c.name === 'perpend-session')!
    const pdf = await fetch(href!, { headers: { cookie: `${session.name}=${session.value}` } })
    expect(pdf.status).toBe(200)
    const text = (await pdfText(new Uint8Array(await pdf.arrayBuffer()))).text
    expect(text).toContain('Corrstone lightweight-aggregate block')
    expect(text).toContain('Installing the ETICS')
    expect(text).toContain(`Total ${total}`)
    expect(text).toContain('Demo prices — invented')
    expect(errors).toEqual([])
    await page.close()
  })
})
