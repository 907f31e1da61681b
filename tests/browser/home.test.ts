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
    for (const label of ['Detail library', 'Workbench', 'Desk', 'Turnaround', 'Sign in']) {
      expect(await page.locator('header nav').getByText(label, { exact: true }).count()).toBe(1)
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
    for (const path of ['/library', '/workbench', '/desk', '/turnaround', '/sign-in']) {
      const response = await page.goto(url(path))
      expect(response?.status(), path).toBe(200)
      expect(await page.locator('h1').count(), path).toBeGreaterThan(0)
    }
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
