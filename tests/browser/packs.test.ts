import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fetch, url } from '@nuxt/test-utils/e2e'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startMailCatcher } from '../../scripts/mail-catcher'
import { call, demo, signIn as apiSignIn } from '../support/api'
import { launchChromium, screenshotDir, signInPage } from '../support/chromium'
import { pdfText } from '../support/pdf'
import { useBuiltServer } from '../support/server'
import { demoWall } from '../support/walls'

/**
 * A reply goes out as a response pack: the officer composes it on the enquiry file with one detail sheet and
 * one calculation and issues it; the requester finds it under "my enquiries"; the development mailbox shows
 * the mail with the PDF.
 */

const mailboxDir = mkdtempSync(join(tmpdir(), 'perpend-mailbox-'))
const catcher = await startMailCatcher({ port: 0, dir: mailboxDir })


describe('a response pack from the composer to the requester and the mailbox', async () => {
  await useBuiltServer({ NUXT_MAIL_URL: `smtp://127.0.0.1:${catcher.port}`, PERPEND_DEV_MAILBOX: '1', PERPEND_MAILBOX_DIR: mailboxDir })
  let browser: Awaited<ReturnType<typeof launchChromium>>
  let ref = ''
  let calcId = 0
  const errors: string[] = []
  const reply = 'The frame sits at the block face, fixed through the reveal; the calculation gives the wall\'s U-value.'

  beforeAll(async () => {
    browser = await launchChromium()
    // Arrange through the API: the specifier's enquiry, in hand, with a saved U-value calculation.
    const [spec, officer] = await Promise.all([apiSignIn(demo.specA), apiSignIn(demo.officer)])
    const created = await call('/api/enquiries', {
      cookie: spec,
      body: { project: { name: 'Glenmore Terrace', region: 'Wicklow', stage: 'tender' }, topic: 'junctions', subject: 'Window jamb at plot 7', question: 'How is the window frame fixed at the jamb with 150 mm EPS?', priority: 'normal' },
    })
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    ref = created.body.ref
    expect((await call(`/api/enquiries/${ref}`, { method: 'PATCH', cookie: officer, body: { status: 'in_hand' } })).status).toBe(200)
    const calc = await call(`/api/enquiries/${ref}/calculations`, { cookie: officer, body: { method: 'u-value', inputs: demoWall } })
    expect(calc.status, JSON.stringify(calc.body)).toBe(201)
    calcId = calc.body.calculation.id
  })
  afterAll(async () => {
    await browser?.close()
    await catcher.close()
    rmSync(mailboxDir, { recursive: true, force: true })
  })

  it('lets the officer compose the pack with one detail and one calculation and issue it', async () => {
    const page = await browser.context.newPage()
    page.on('pageerror', e => errors.push(e.message))
    await signInPage(page, demo.officer)
    await page.goto(url(`/desk/${ref}`), { waitUntil: 'networkidle' })
    const composer = page.getByRole('region', { name: 'Response pack' })
    await composer.getByLabel('Reply').fill(`## Fixing at the jamb\n\n${reply}`)
    await composer.getByLabel('Search the library').fill('D-WIN-03')
    const results = composer.getByRole('list', { name: 'Search results' })
    await results.getByText('Window jamb, frame at block face').waitFor()
    await results.locator('li').filter({ hasText: 'D-WIN-03' }).getByRole('button', { name: 'Add' }).click()
    await composer.getByRole('button', { name: 'Remove D-WIN-03' }).waitFor()
    await composer.getByRole('checkbox', { name: new RegExp(`no\\. ${calcId},`) }).check()
    await composer.getByRole('button', { name: 'Issue the pack' }).click()
    await composer.getByRole('status').filter({ hasText: 'Revision A issued and e-mailed to the requester.' }).waitFor()
    await composer.getByRole('link', { name: `Download ${ref}-response-rev-A.pdf` }).waitFor()
    await page.screenshot({ path: join(screenshotDir, 'pack-issued-officer.png'), fullPage: true })
    await page.close()
  })

  it('shows the requester the answer and the pack under "my enquiries", and the PDF holds what was sent', async () => {
    const page = await browser.context.newPage()
    page.on('pageerror', e => errors.push(e.message))
    await signInPage(page, demo.specA)
    await page.goto(url('/my-enquiries'), { waitUntil: 'networkidle' })
    await page.screenshot({ path: join(screenshotDir, 'pack-my-enquiries.png'), fullPage: true })
    const row = page.getByRole('link', { name: new RegExp(ref) }).first()
    await row.waitFor()
    await row.click()
    await page.waitForURL(new RegExp(`/my-enquiries/${ref}$`))
    await page.getByText(reply).waitFor()
    const packs = page.getByTestId('my-packs')
    await packs.getByText('Revision A').waitFor()
    await expect.poll(() => packs.innerText()).toMatch(/1 library item, 1 calculation/)
    const link = packs.getByRole('link', { name: `Download ${ref}-response-rev-A.pdf` })
    const href = await link.getAttribute('href')
    const cookie = (await browser.context.cookies()).map(c => `${c.name}=${c.value}`).join('; ')
    const res = await fetch(href!, { headers: { cookie } })
    expect(res.status).toBe(200)
    const { text } = await pdfText(new Uint8Array(await res.arrayBuffer()))
    expect(text).toContain(ref)
    expect(text).toContain(reply)
    expect(text).toContain('Window jamb, frame at block face')
    expect(text).toContain('Calculation 1: U-value')
    await page.screenshot({ path: join(screenshotDir, 'pack-requester.png'), fullPage: true })
    await page.close()
  })

  it('shows the mail with its PDF on the development mailbox page', async () => {
    await catcher.waitFor(m => m.subject.startsWith(`Re: ${ref}`))
    const page = await browser.context.newPage()
    page.on('pageerror', e => errors.push(e.message))
    await page.goto(url('/dev/mailbox'), { waitUntil: 'networkidle' })
    const list = page.getByRole('list', { name: 'Caught mail' })
    await list.getByRole('button', { name: new RegExp(`Re: ${ref}`) }).click()
    const article = page.locator('article')
    await article.getByRole('heading', { name: new RegExp(`Re: ${ref}`) }).waitFor()
    await expect.poll(() => article.innerText()).toContain(`${ref}-response-rev-A.pdf`)
    await expect.poll(() => article.innerText()).toContain(demo.specA)
    await page.screenshot({ path: join(screenshotDir, 'pack-mailbox.png'), fullPage: true })
    expect(errors).toEqual([])
    await page.close()
  })
})
