import { mkdirSync, mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { chromium } from 'playwright-core'
import type { BrowserContext, Page } from 'playwright-core'
import { url } from '@nuxt/test-utils/e2e'
import { rootDir } from './server'

export const screenshotDir = join(rootDir, 'test-output', 'browser')

/** Debian's Chromium (installed by the test set-up), headless, in a fresh profile that is removed afterwards. */
export async function launchChromium(): Promise<{ context: BrowserContext, close: () => Promise<void> }> {
  const profile = mkdtempSync(join(tmpdir(), 'perpend-chromium-'))
  mkdirSync(screenshotDir, { recursive: true })
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    viewport: { width: 1280, height: 900 },
    args: [
      '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
      '--disable-background-networking', '--disable-component-update', '--disable-sync',
    ],
  })
  return {
    context,
    close: async () => {
      await context.close()
      rmSync(profile, { recursive: true, force: true })
    },
  }
}

/** Signs a demo person in through the sign-in page, starting signed out (earlier cookies cleared). */
export async function signInPage(page: Page, email: string, password = 'corrstone-demo-2026') {
  await page.context().clearCookies()
  await page.goto(url('/sign-in'), { waitUntil: 'networkidle' })
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(password)
  await page.getByRole('main').getByRole('button', { name: 'Sign in' }).click()
  await page.getByTestId('signed-in-as').waitFor()
}
