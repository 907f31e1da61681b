import { join } from 'node:path'
import { url } from '@nuxt/test-utils/e2e'
import PDFDocument from 'pdfkit'
import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchChromium, screenshotDir, signInPage } from '../support/chromium'
import { useBuiltServer } from '../support/server'

/** A real one-page PDF drawing, made here so the preview has something to render. */
function drawingPdf(title: string): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const doc = new PDFDocument({ size: 'A4', margin: 50 })
    const chunks: Buffer[] = []
    doc.on('data', (c: Buffer) => chunks.push(c))
    doc.on('end', () => resolve(Buffer.concat(chunks)))
    doc.on('error', reject)
    doc.fontSize(20).text(title)
    doc.moveDown().fontSize(12).text('Section through the eaves junction — invented test drawing.')
    doc.rect(50, 200, 400, 250).lineWidth(3).stroke()
    doc.end()
  })
}
// A valid 1×1 PNG.
const onePixelPng = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAQAAAC1HAwCAAAAC0lEQVR42mNkYAAAAAYAAjCB0C8AAAAASUVORK5CYII=', 'base64')

async function signOut(page: Page) {
  await page.getByRole('button', { name: 'Sign out' }).click()
  await page.locator('header').getByRole('link', { name: 'Sign in' }).waitFor()
}

/** Steps 2–5 of the intake (the project onwards), then the confirmation page's reference. */
async function fillFromProject(page: Page, subject: string, files: { name: string, mimeType: string, buffer: Buffer }[]) {
  await page.getByLabel('Project name').fill('Glenmore Terrace')
  await page.getByLabel('County or region').fill('Co. Wicklow')
  await page.getByLabel('Stage').selectOption('tender')
  await page.getByLabel('Storeys').fill('2')
  await page.getByRole('button', { name: 'Continue' }).click()

  await page.getByLabel('Topic').selectOption('junctions')
  await page.getByLabel('Subject').fill(subject)
  await page.getByLabel('The question').fill('What psi value should we use for the eaves junction shown in the attached section, with 150 mm EPS?')
  await page.getByRole('button', { name: 'Continue' }).click()

  await page.getByLabel('Drawings').setInputFiles(files)
  await expect.poll(() => page.getByTestId('chosen-files').locator('li').count()).toBe(files.length + 1)
  await page.getByRole('button', { name: 'Continue' }).click()

  await page.getByText('Step', { exact: false }).filter({ hasText: 'Check and send' }).waitFor()
  await page.getByRole('button', { name: 'Send the enquiry' }).click()
  await page.waitForURL(/\/enquire\/sent\?ref=/)
  const ref = (await page.getByTestId('sent-ref').innerText()).trim()
  expect(ref).toMatch(/^TQ-\d{4}-\d{4,}$/)
  return ref
}

async function openFromQueue(page: Page, ref: string) {
  await page.goto(url('/desk'), { waitUntil: 'networkidle' })
  await page.getByLabel('Search').fill(ref)
  // The search waits for a pause in typing, then lands in the URL for sharing.
  await page.waitForURL(new RegExp(`[?&]q=${ref}`))
  await expect.poll(() => page.locator('tr[data-ref]').count()).toBe(1)
  const row = page.locator(`tr[data-ref="${ref}"]`)
  await row.waitFor()
  return row
}

describe('the enquiry desk from intake to the requester\'s reply', async () => {
  await useBuiltServer()
  let browser: Awaited<ReturnType<typeof launchChromium>>
  let page: Page
  const errors: string[] = []
  let publicRef = ''
  let specifierRef = ''
  let pdf: Buffer
  beforeAll(async () => {
    browser = await launchChromium()
    page = await browser.context.newPage()
    page.on('pageerror', e => errors.push(e.message))
    page.on('console', (m) => { if (m.type() === 'error' && /hydration/i.test(m.text())) errors.push(m.text()) })
    pdf = await drawingPdf('Eaves junction E-01')
  })
  afterAll(async () => { await browser?.close() })

  it('takes an enquiry with two drawings from the public, checking each step and keeping the draft over a reload', async () => {
    await page.goto(url('/'), { waitUntil: 'networkidle' })
    await page.locator('header').getByRole('link', { name: 'Ask a question' }).click()
    await page.waitForURL(/\/enquire$/)
    // Each step is checked with the shared schema before moving on.
    await page.getByRole('button', { name: 'Continue' }).click()
    await page.getByText('Enter your name').waitFor()
    await expect(page.getByLabel('Your name').getAttribute('aria-invalid')).resolves.toBe('true')

    await page.getByLabel('Your name').fill('Saoirse Public')
    await page.getByLabel('Organisation').fill('Public Test Builders')
    await page.getByLabel('E-mail').fill('saoirse.public@example.invalid')
    await page.getByLabel('Phone').fill('+353 1 555 0100')
    await page.getByRole('button', { name: 'Continue' }).click()
    await page.getByLabel('Project name').waitFor()
    await page.getByLabel('Project name').fill('Half typed')

    await page.reload({ waitUntil: 'networkidle' })
    await expect(page.getByLabel('Project name').inputValue()).resolves.toBe('Half typed')
    await page.getByRole('button', { name: 'Back' }).click()
    await expect(page.getByLabel('Your name').inputValue()).resolves.toBe('Saoirse Public')
    await page.getByRole('button', { name: 'Continue' }).click()

    publicRef = await fillFromProject(page, 'Eaves psi for the public test', [
      { name: 'eaves-section.pdf', mimeType: 'application/pdf', buffer: pdf },
      { name: 'site-photo.png', mimeType: 'image/png', buffer: onePixelPng },
    ])
    await page.getByText('acknowledgement e-mail').waitFor()
    // Sent: the draft is gone, so the next question starts empty.
    await page.goto(url('/enquire'), { waitUntil: 'networkidle' })
    await expect(page.getByLabel('Your name').inputValue()).resolves.toBe('')
  })

  it('takes an enquiry from a signed-in specifier, who skips the step about themselves', async () => {
    await signInPage(page, 'architect@hallorans.example')
    await page.goto(url('/enquire'), { waitUntil: 'networkidle' })
    await page.getByTestId('intake-signed-in').waitFor()
    specifierRef = await fillFromProject(page, 'Eaves psi value for Glenmore Terrace', [
      { name: 'eaves-section.pdf', mimeType: 'application/pdf', buffer: pdf },
      { name: 'site-photo.png', mimeType: 'image/png', buffer: onePixelPng },
    ])
    expect(specifierRef).not.toBe(publicRef)
    await signOut(page)
  })

  it('lets an officer find, take and preview the enquiry, note internally and wait on the requester', async () => {
    await signInPage(page, 'officer@corrstone.example')
    const publicRow = await openFromQueue(page, publicRef)
    await expect(publicRow.innerText()).resolves.toContain('Saoirse Public')

    const row = await openFromQueue(page, specifierRef)
    await expect(row.innerText()).resolves.toContain('Orla Halloran')
    await expect(row.getByTestId('status-badge').innerText()).resolves.toBe('Received')
    await expect(row.locator('[data-clock="running"]').innerText()).resolves.toMatch(/left$/)
    await page.screenshot({ path: join(screenshotDir, 'desk-queue.png'), fullPage: true })
    // On a phone the rows become stacked cards.
    await page.setViewportSize({ width: 390, height: 844 })
    await expect(page.locator('table[data-testid="desk-queue"] thead').isVisible()).resolves.toBe(false)
    await expect(row.getByRole('link', { name: specifierRef }).isVisible()).resolves.toBe(true)
    await page.screenshot({ path: join(screenshotDir, 'desk-queue-phone.png'), fullPage: true })
    await page.setViewportSize({ width: 1280, height: 900 })

    await row.getByRole('link', { name: specifierRef }).click()
    await page.waitForURL(new RegExp(`/desk/${specifierRef}$`))
    await page.getByRole('heading', { name: 'Eaves psi value for Glenmore Terrace' }).waitFor()
    await page.getByRole('button', { name: 'Take this enquiry' }).click()
    await expect.poll(() => page.getByTestId('assignee').innerText()).toBe('Niamh Brennan')
    await page.getByText('Niamh Brennan changed status from Received to In hand').waitFor()

    // The PDF is drawn by pdfjs into a canvas; the PNG shows inline.
    const canvas = page.getByTestId('pdf-canvas')
    await expect.poll(() => canvas.evaluate((c: HTMLCanvasElement) => c.width * c.height), { timeout: 15_000 }).toBeGreaterThan(0)
    await page.getByText('Page 1 of 1').waitFor()
    const painted = await canvas.evaluate((c: HTMLCanvasElement) => {
      const d = c.getContext('2d')!.getImageData(0, 0, c.width, c.height).data
      let dark = 0
      for (let i = 0; i < d.length; i += 4) if (d[i]! < 128) dark++
      return dark
    })
    expect(painted).toBeGreaterThan(100)
    // The image loads lazily: bring it into view, then wait for it.
    const photo = page.locator('img[alt="Drawing site-photo.png"]')
    await photo.scrollIntoViewIfNeeded()
    await expect.poll(() => photo.evaluate((img: HTMLImageElement) => img.complete ? img.naturalWidth : 0), { timeout: 10_000 }).toBe(1)

    await page.getByLabel('Internal note').check()
    await page.getByLabel('Note', { exact: true }).fill('Looks like detail D-EAV-02; check the wall plate position before replying.')
    await page.getByRole('button', { name: 'Add internal note' }).click()
    const note = page.locator('[data-kind="note"]')
    await note.waitFor()
    await expect(note.textContent()).resolves.toContain('Internal — not sent')

    await page.locator('[data-transition="waiting_on_requester"]').click()
    await page.getByText('Niamh Brennan changed status from In hand to Waiting on requester').waitFor()
    await expect(page.locator('[data-clock="paused"]').innerText()).resolves.toContain('Paused')
    await page.screenshot({ path: join(screenshotDir, 'desk-file.png'), fullPage: true })
    await signOut(page)
  })

  it('shows the specifier the public thread only and takes their reply with another file', async () => {
    await signInPage(page, 'architect@hallorans.example')
    await page.getByRole('link', { name: 'My enquiries' }).click()
    await page.getByRole('link', { name: specifierRef }).click()
    await page.waitForURL(new RegExp(`/my-enquiries/${specifierRef}$`))
    await expect(page.getByTestId('status-badge').innerText()).resolves.toBe('Waiting on requester')
    const thread = await page.getByTestId('thread').innerText()
    expect(thread).not.toContain('wall plate position')
    await page.getByLabel('Your message').fill('The wall plate sits on the inner 100 mm of the block; revised section attached.')
    await page.getByLabel('Add more drawings').setInputFiles([{ name: 'eaves-revised.pdf', mimeType: 'application/pdf', buffer: pdf }])
    await page.getByRole('button', { name: 'Send message' }).click()
    await page.getByText('Your message is with the technical department.').waitFor()
    await expect.poll(() => page.getByTestId('status-badge').innerText()).toBe('In hand')
    await expect(page.getByRole('link', { name: 'Download eaves-revised.pdf' }).count()).resolves.toBe(1)
    await signOut(page)
  })

  it('shows the officer the reply, with the enquiry back in hand', async () => {
    await signInPage(page, 'officer@corrstone.example')
    const row = await openFromQueue(page, specifierRef)
    await expect(row.getByTestId('status-badge').innerText()).resolves.toBe('In hand')
    await row.getByRole('link', { name: specifierRef }).click()
    await page.locator('[data-kind="requester"]').filter({ hasText: 'revised section attached' }).waitFor()
    await page.getByText('Orla Halloran changed status from Waiting on requester to In hand').waitFor()
    await expect(page.getByRole('heading', { name: /Drawings and files \(3\)/ }).count()).resolves.toBe(1)
    await signOut(page)
  })

  it('lets a manager read and save the service targets in working days and hours', async () => {
    await signInPage(page, 'manager@corrstone.example')
    await page.goto(url('/desk'), { waitUntil: 'networkidle' })
    await page.getByRole('link', { name: 'Service targets' }).click()
    await page.waitForURL(/\/desk\/targets$/)
    const days = page.getByLabel('Normal: first response, working days')
    await expect.poll(() => days.inputValue()).toMatch(/^\d+$/)
    const before = await days.inputValue()
    await page.getByRole('button', { name: 'Save targets' }).click()
    await page.getByText(/^Saved\./).waitFor()
    await expect(days.inputValue()).resolves.toBe(before)
    await signOut(page)
    expect(errors).toEqual([])
  })
})
