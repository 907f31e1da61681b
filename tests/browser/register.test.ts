import { join } from 'node:path'
import { url } from '@nuxt/test-utils/e2e'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startMailCatcher } from '../../scripts/mail-catcher'
import { launchChromium, screenshotDir } from '../support/chromium'
import { useBuiltServer } from '../support/server'

const catcher = await startMailCatcher({ port: 0 })

describe('a specifier registers, confirms the address from the mail, signs in and out', async () => {
  await useBuiltServer({ NUXT_MAIL_URL: `smtp://127.0.0.1:${catcher.port}` })
  let browser: Awaited<ReturnType<typeof launchChromium>>
  beforeAll(async () => { browser = await launchChromium() })
  afterAll(async () => {
    await browser?.close()
    await catcher.close()
  })

  it('goes from registration to an empty "my enquiries" view', async () => {
    const page = await browser.context.newPage()
    const email = 'new.architect@example.invalid'
    await page.goto(url('/account/register'), { waitUntil: 'networkidle' })
    await page.getByLabel('Your name').fill('Fionnuala Test')
    await page.getByLabel('E-mail').fill(email)
    await page.getByLabel('Password (10 characters or more)').fill('browser-test-password')
    await page.getByLabel('Organisation', { exact: true }).fill('Test Studio Architects')
    await page.getByRole('button', { name: 'Register' }).click()
    await page.getByText('Check your inbox').waitFor()

    const mail = await catcher.waitFor(m => m.envelopeTo.includes(email))
    expect(mail.html).toContain('Confirm my address')
    const link = new URL(/https?:\/\/\S+\/account\/verify\?token=[\w-]+/.exec(mail.text)![0])
    // The link names the configured site; open the same path on the server under test.
    await page.goto(url(`${link.pathname}${link.search}`), { waitUntil: 'networkidle' })
    await page.getByRole('button', { name: 'Confirm my address' }).click()
    await page.getByText('Your e-mail address is confirmed').waitFor()

    await page.getByRole('main').getByRole('link', { name: 'Sign in' }).click()
    await page.getByLabel('E-mail').fill(email)
    await page.getByLabel('Password').fill('browser-test-password')
    await page.getByRole('main').getByRole('button', { name: 'Sign in' }).click()
    await page.getByTestId('signed-in-as').waitFor()
    expect(await page.getByTestId('signed-in-as').innerText()).toContain('Fionnuala Test')

    await page.getByRole('link', { name: 'My enquiries' }).click()
    await page.getByTestId('no-enquiries').waitFor()
    await page.screenshot({ path: join(screenshotDir, 'my-enquiries-empty.png'), fullPage: true })

    await page.getByRole('button', { name: 'Sign out' }).click()
    await page.locator('header').getByRole('link', { name: 'Sign in' }).waitFor()
    const me = await page.evaluate(() => fetch('/api/auth/me').then(r => r.json()))
    expect(me.user).toBeNull()
  })
})
