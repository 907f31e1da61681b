import { join } from 'node:path'
import { fetch, url } from '@nuxt/test-utils/e2e'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchChromium, screenshotDir } from '../support/chromium'
import { useBuiltServer } from '../support/server'

const ref6 = `TQ-${new Date().getUTCFullYear()}-0006`

describe('workbench in Chromium', async () => {
  await useBuiltServer()
  let browser: Awaited<ReturnType<typeof launchChromium>>
  beforeAll(async () => { browser = await launchChromium() })
  afterAll(async () => { await browser?.close() })

  it('builds the demo wall, updates U as the insulation changes and saves the calculation to an enquiry', async () => {
    const page = await browser.context.newPage()
    const errors: string[] = []
    page.on('pageerror', e => errors.push(e.message))
    await page.goto(url('/workbench'), { waitUntil: 'networkidle' })
    await page.getByRole('link', { name: 'U-value' }).first().click()
    await page.waitForURL(/\/workbench\/u-value$/)

    await page.getByRole('button', { name: /Two-leaf cavity wall/ }).click()
    await page.getByRole('button', { name: /Corrstone single-leaf insulated wall/ }).click()
    const uValue = page.getByTestId('u-value')
    const unrounded = page.getByTestId('u-unrounded')
    await expect(uValue.textContent()).resolves.toMatch(/^0\.\d\d /)
    const before = Number(await unrounded.textContent())
    expect(before).toBeGreaterThan(0.1)
    expect(before).toBeLessThan(0.25)

    const insulation = page.getByLabel('Corrstone ETICS board, graphite EPS (demo) thickness')
    await insulation.fill('200')
    await expect.poll(async () => Number(await unrounded.textContent())).toBeLessThan(before)
    const thicker = Number(await unrounded.textContent())

    // An empty field is a message on the field, never NaN in the result.
    await insulation.fill('')
    await expect(page.getByTestId('u-error').textContent()).resolves.toMatch(/Layer thickness must be a number/)
    expect(await page.locator('main').innerText()).not.toMatch(/NaN|Infinity/)
    await insulation.fill('200')
    await expect.poll(async () => Number(await unrounded.textContent())).toBe(thicker)

    await page.getByTestId('find-thickness').click()
    await expect(page.getByTestId('thickness-answer').textContent()).resolves.toMatch(/\d+ mm/)
    expect(await page.getByTestId('caution').first().innerText()).toMatch(/EN ISO 6946/)
    expect(await page.locator('main').innerText()).toMatch(/Technical Guidance Document L 2019/)

    await page.getByLabel('E-mail').fill('officer@corrstone.example')
    await page.getByLabel('Password').fill('corrstone-demo-2026')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.getByLabel('Enquiry reference').fill(ref6)
    await page.getByRole('button', { name: 'Save calculation' }).click()
    await expect(page.getByTestId('saved').textContent()).resolves.toMatch(new RegExp(`Saved as calculation \\d+ on ${ref6}`))
    const savedId = Number((await page.getByTestId('saved').textContent())!.match(/calculation (\d+)/)![1])

    await page.screenshot({ path: join(screenshotDir, 'workbench.png'), fullPage: true })

    // The wall carries over to the other methods.
    await page.getByRole('link', { name: 'Workbench', exact: true }).first().click()
    await page.getByRole('link', { name: 'Interstitial condensation' }).click()
    await expect(page.getByLabel('Corrstone ETICS board, graphite EPS (demo) thickness').inputValue()).resolves.toBe('200')
    await expect(page.getByTestId('year-result').textContent()).resolves.toBeTruthy()
    await page.screenshot({ path: join(screenshotDir, 'workbench-condensation.png'), fullPage: true })
    expect(errors).toEqual([])

    // Check through the API, as the officer, that the server stored its own run of the 200 mm wall.
    const cookies = await browser.context.cookies()
    const session = cookies.find(c => c.name === 'perpend-session')
    expect(session).toBeTruthy()
    const res = await fetch(`/api/enquiries/${ref6}/calculations`, { headers: { cookie: `${session!.name}=${session!.value}` } })
    expect(res.status).toBe(200)
    const { calculations } = await res.json() as { calculations: { id: number, method: string, inputs: { layers: { thickness_mm?: number }[] }, outputs: { u: number } }[] }
    const saved = calculations.find(c => c.id === savedId)
    expect(saved?.method).toBe('u-value')
    expect(saved?.inputs.layers[2]?.thickness_mm).toBe(200)
    expect(saved?.outputs.u).toBeCloseTo(thicker, 4)
  })

  it('shows the moisture, mould and junction methods on the same wall, each with its caution', async () => {
    const page = await browser.context.newPage()
    const errors: string[] = []
    page.on('pageerror', e => errors.push(e.message))

    await page.goto(url('/workbench/condensation'), { waitUntil: 'networkidle' })
    expect(await page.getByTestId('steady-result').innerText()).toMatch(/Total sd \d+\.\d\d m/)
    await page.getByLabel('Climate').selectOption('cold-inland')
    await expect(page.getByTestId('year-result').innerText()).resolves.toMatch(/No interstitial condensation in any month|dries out by|builds up/)
    expect(await page.locator('main').innerText()).toMatch(/invented illustrative dataset/i)
    expect(await page.locator('main').innerText()).toMatch(/humidity class 3/i)

    await page.goto(url('/workbench/mould'), { waitUntil: 'networkidle' })
    await expect(page.getByTestId('frsi').textContent()).resolves.toMatch(/fRsi = 0\.9\d\d/)
    await page.getByLabel('Room RH').fill('140')
    await expect(page.locator('main').innerText()).resolves.toMatch(/Relative humidity must be 0–100 %/)

    await page.goto(url('/workbench/junctions'), { waitUntil: 'networkidle' })
    const y = Number(await page.getByTestId('y-value').textContent())
    expect(y).toBeGreaterThan(0)
    expect(await page.locator('main').innerText()).toMatch(/Default y = 0\.15/)
    expect(await page.getByTestId('caution').innerText()).toMatch(/EN ISO 10211/)
    await page.screenshot({ path: join(screenshotDir, 'workbench-junctions.png'), fullPage: true })
    expect(errors).toEqual([])
  })
})
