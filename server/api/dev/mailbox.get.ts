import { readdir, readFile } from 'node:fs/promises'
import { join } from 'node:path'
import type { StoredMail } from '../../../shared/types/caught-mail'

/** The catcher keeps structured headers (dates, addresses) as JSON; show them as text. */
function headerText(value: string | undefined): string | null {
  if (value === undefined) return null
  try {
    const parsed = JSON.parse(value) as unknown
    if (typeof parsed === 'string') return parsed
    if (parsed && typeof parsed === 'object' && 'text' in parsed) return String((parsed as { text: unknown }).text)
  }
  catch { /* already plain text */ }
  return value
}

/**
 * Development only: the mail the local catcher (scripts/mail-catcher.ts) caught, newest first, so someone
 * running the demo sees every mail the product sent. It shows password-reset links, so it exists only when
 * PERPEND_DEV_MAILBOX=1 (the demo start script sets it); anywhere else it answers 404 like a missing route.
 */
export default defineEventHandler(async (event) => {
  if (process.env.PERPEND_DEV_MAILBOX !== '1') throw createError({ statusCode: 404, statusMessage: 'Page not found' })
  await publicRoute(event)
  const dir = process.env.PERPEND_MAILBOX_DIR || join(process.cwd(), 'var', 'mailbox')
  const names = await readdir(dir).catch(() => [] as string[])
  // The catcher names each file "<epoch ms>-<counter>.json".
  const order = (name: string) => name.split(/[-.]/).slice(0, 2).map(Number)
  const newest = names.filter(n => /^\d+-\d+\.json$/.test(n))
    .sort((a, b) => { const [ta, ca] = order(a); const [tb, cb] = order(b); return tb! - ta! || cb! - ca! })
    .slice(0, 100)
  const mails = await Promise.all(newest.map(async (name) => {
    try {
      const mail = JSON.parse(await readFile(join(dir, name), 'utf8')) as StoredMail
      return {
        id: mail.id,
        receivedAt: mail.receivedAt,
        date: headerText(mail.headers.date),
        from: mail.from,
        to: mail.to,
        envelopeTo: mail.envelopeTo,
        subject: mail.subject,
        messageId: headerText(mail.headers['message-id']),
        inReplyTo: headerText(mail.headers['in-reply-to']),
        replyTo: headerText(mail.headers['reply-to']),
        text: mail.text,
        html: mail.html,
        attachments: mail.attachments.map(a => ({ filename: a.filename, contentType: a.contentType, size: a.size })),
      }
    }
    catch {
      return null // a file the catcher is still writing
    }
  }))
  return { directory: dir, mails: mails.filter(m => m !== null) }
})
