import { join } from 'node:path'
import { url } from '@nuxt/test-utils/e2e'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchChromium, screenshotDir } from '../support/chromium'
import { useBuiltServer } from '../support/server'

describe('home page in Chromium', async () => {
  await useBuiltServer()
  let browser: Awaited<ReturnType<typeof launchChromium>>
  beforeAll(async () => { browser = await launchChromium() })
  afterAll(async () => { await browser?.close() })

  it('shows the shell, loads its fonts from the app itself and sends nothing off the machine', async () => {
    const page = await browser.context.newPage()
    const requested: string[] = []
    page.on('request', req => requested.push(req.url()))
    const response = await page.goto(url('/'), { waitUntil: 'networkidle' })
    expect(response?.status()).toBe(200)

    await expect(page.locator('header').getByText('Perpend', { exact: true }).count()).resolves.toBe(1)
    for (const label of ['Ask a question', 'Detail library', 'Workbench', 'Sign in']) {
      expect(await page.locator('header nav').getByText(label, { exact: true }).count()).toBe(1)
    }
    // The desk and the manager's view are not offered to the public.
    for (const label of ['Desk', 'Turnaround']) {
      expect(await page.locator('header nav').getByText(label, { exact: true }).count()).toBe(0)
    }
    expect(await page.locator('footer').innerText()).toContain('invented')

    const fontLoaded = await page.evaluate(async () => {
      await document.fonts.ready
      return document.fonts.check('16px "Source Sans 3"')
    })
    expect(fontLoaded).toBe(true)
    const fontRequests = requested.filter(u => /\.woff2?(\?|$)/.test(u))
    expect(fontRequests.length).toBeGreaterThan(0)
    const offMachine = requested.filter(u => !/^(https?:\/\/(127\.0\.0\.1|localhost)(:\d+)?\/|data:|blob:)/.test(u))
    expect(offMachine).toEqual([])

    await page.screenshot({ path: join(screenshotDir, 'home.png'), fullPage: true })
  })

  it('leads every navigation link to a page that answers', async () => {
    const page = await browser.context.newPage()
    for (const path of ['/enquire', '/library', '/workbench', '/sign-in']) {
      const response = await page.goto(url(path))
      expect(response?.status(), path).toBe(200)
      expect(await page.locator('h1').count(), path).toBeGreaterThan(0)
    }
  })

  it.each([
    { email: 'officer@corrstone.example', shown: ['Desk'], hidden: ['Turnaround'] },
    { email: 'manager@corrstone.example', shown: ['Desk', 'Turnaround'], hidden: [] },
    { email: 'architect@hallorans.example', shown: ['My enquiries'], hidden: ['Desk', 'Turnaround'] },
  ])('offers $email the parts of the product their role opens', async ({ email, shown, hidden }) => {
    await browser.context.clearCookies()
    const page = await browser.context.newPage()
    await page.goto(url('/sign-in'), { waitUntil: 'networkidle' })
    await page.getByLabel('E-mail').fill(email)
    await page.getByLabel('Password').fill('corrstone-demo-2026')
    await page.getByRole('main').getByRole('button', { name: 'Sign in' }).click()
    await page.getByTestId('signed-in-as').waitFor()
    const nav = page.locator('header nav')
    for (const label of shown) await nav.getByRole('link', { name: label, exact: true }).waitFor()
    for (const label of hidden) expect(await nav.getByText(label, { exact: true }).count(), label).toBe(0)
    await page.close()
    await browser.context.clearCookies()
  })

  it('collapses the navigation behind a menu button on a phone', async () => {
    const page = await browser.context.newPage()
    await page.setViewportSize({ width: 375, height: 740 })
    await page.goto(url('/'))
    await expect(page.locator('#main-nav').isVisible()).resolves.toBe(false)
    await page.getByRole('button', { name: 'Menu' }).click()
    await expect(page.locator('#main-nav').isVisible()).resolves.toBe(true)
    await page.screenshot({ path: join(screenshotDir, 'home-phone.png') })
  })
})
