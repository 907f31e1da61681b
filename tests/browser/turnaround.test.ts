import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { url } from '@nuxt/test-utils/e2e'
import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchChromium, screenshotDir } from '../support/chromium'
import { useBuiltServer } from '../support/server'

describe('the manager\'s turnaround view in Chromium', async () => {
  await useBuiltServer()
  let browser: Awaited<ReturnType<typeof launchChromium>>
  let page: Page
  const errors: string[] = []
  beforeAll(async () => {
    browser = await launchChromium()
    page = await browser.context.newPage()
    page.on('pageerror', e => errors.push(e.message))
  })
  afterAll(async () => { await browser?.close() })

  it('keeps officers out of the view', async () => {
    await page.goto(url('/sign-in'), { waitUntil: 'networkidle' })
    await page.getByLabel('E-mail').fill('officer@corrstone.example')
    await page.getByLabel('Password').fill('corrstone-demo-2026')
    await page.getByRole('main').getByRole('button', { name: 'Sign in' }).click()
    await page.getByTestId('signed-in-as').waitFor()
    await page.goto(url('/turnaround'), { waitUntil: 'networkidle' })
    expect(new URL(page.url()).pathname).toBe('/')
    await page.getByRole('button', { name: 'Sign out' }).click()
    await page.locator('header').getByRole('link', { name: 'Sign in' }).waitFor()
  })

  it('lets the manager open the view, change the period and export the rows as CSV', async () => {
    await page.goto(url('/sign-in'), { waitUntil: 'networkidle' })
    await page.getByLabel('E-mail').fill('manager@corrstone.example')
    await page.getByLabel('Password').fill('corrstone-demo-2026')
    await page.getByRole('main').getByRole('button', { name: 'Sign in' }).click()
    await page.getByTestId('signed-in-as').waitFor()

    await page.goto(url('/turnaround'), { waitUntil: 'networkidle' })
    await page.getByRole('heading', { name: 'Turnaround', level: 1 }).waitFor()
    await expect(page.getByTestId('turnaround-tiles').locator('li').count()).resolves.toBe(6)
    // The default is the last 4 weeks: four rows in the weekly table, and the charts drawn on canvases.
    await expect.poll(() => page.getByTestId('turnaround-trend-table').locator('tbody tr').count()).toBe(4)
    await expect.poll(() => page.locator('canvas').count()).toBe(3)
    const before = await page.getByTestId('turnaround-period').innerText()

    await page.getByRole('button', { name: 'Last 13 weeks' }).click()
    await page.waitForURL(/[?&]period=quarter/)
    await expect.poll(() => page.getByTestId('turnaround-trend-table').locator('tbody tr').count()).toBe(13)
    await expect.poll(() => page.getByTestId('turnaround-period').innerText()).not.toBe(before)
    await expect(page.getByRole('button', { name: 'Last 13 weeks' }).getAttribute('aria-pressed')).resolves.toBe('true')

    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByTestId('turnaround-export').click(),
    ])
    expect(download.suggestedFilename()).toMatch(/^turnaround-\d{4}-\d{2}-\d{2}-to-\d{4}-\d{2}-\d{2}\.csv$/)
    const text = readFileSync((await download.path())!, 'utf8')
    expect(text.split('\r\n')[0]).toBe('ref,received,first_response,answered,closed,status,topic,priority,officer,organisation,working_hours_to_first_response,working_hours_to_answer,first_response_within_target,answer_within_target')

    await page.screenshot({ path: join(screenshotDir, 'turnaround.png'), fullPage: true })
    expect(errors).toEqual([])
  })
})
