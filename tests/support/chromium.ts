import { mkdirSync, mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { chromium } from 'playwright-core'
import type { BrowserContext } from 'playwright-core'
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
