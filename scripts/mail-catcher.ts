// The local SMTP catcher: accepts every message on loopback, parses it and keeps it, so that nothing the
// product sends in development or tests leaves the machine. Run directly it listens on NUXT_MAIL_URL's
// port and writes each message as JSON into PERPEND_MAILBOX_DIR for the development mailbox page.
import { mkdirSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { pathToFileURL } from 'node:url'
import { simpleParser } from 'mailparser'
import type { AddressObject } from 'mailparser'
import { SMTPServer } from 'smtp-server'
import type { StoredMail, StoredMailAttachment } from '../shared/types/caught-mail'

export interface CaughtAttachment extends StoredMailAttachment {
  content: Buffer
}

export type CaughtMail = StoredMail<CaughtAttachment>

export interface MailCatcher {
  port: number
  messages: CaughtMail[]
  /** Resolves with the first message (already caught or still to come) that satisfies the predicate. */
  waitFor: (predicate: (mail: CaughtMail) => boolean, timeoutMs?: number) => Promise<CaughtMail>
  close: () => Promise<void>
}

function addressText(a: AddressObject | AddressObject[] | undefined): string {
  if (!a) return ''
  return (Array.isArray(a) ? a : [a]).map(x => x.text).join(', ')
}

export async function startMailCatcher(options: { port?: number, host?: string, dir?: string } = {}): Promise<MailCatcher> {
  const messages: CaughtMail[] = []
  const waiters: { predicate: (m: CaughtMail) => boolean, resolve: (m: CaughtMail) => void }[] = []
  let counter = 0
  if (options.dir) mkdirSync(options.dir, { recursive: true })

  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    size: 200 * 1024 * 1024,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const headers: Record<string, string> = {}
          for (const [key, value] of parsed.headers) headers[key] = typeof value === 'string' ? value : JSON.stringify(value)
          const mail: CaughtMail = {
            id: `${Date.now()}-${++counter}`,
            receivedAt: new Date().toISOString(),
            envelopeFrom: session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
            envelopeTo: session.envelope.rcptTo.map(r => r.address),
            from: addressText(parsed.from),
            to: addressText(parsed.to),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : null,
            headers,
            attachments: parsed.attachments.map(a => ({ filename: a.filename ?? null, contentType: a.contentType, size: a.size, content: a.content })),
          }
          messages.push(mail)
          if (options.dir) {
            const stored = { ...mail, attachments: mail.attachments.map(a => ({ ...a, content: a.content.toString('base64') })) }
            writeFileSync(join(options.dir, `${mail.id}.json`), JSON.stringify(stored))
          }
          for (const w of [...waiters]) {
            if (w.predicate(mail)) {
              waiters.splice(waiters.indexOf(w), 1)
              w.resolve(mail)
            }
          }
          callback()
        })
        .catch(callback)
    },
  })

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(options.port ?? 0, options.host ?? '127.0.0.1', () => resolve())
  })
  const address = server.server.address()
  const port = typeof address === 'object' && address ? address.port : 0

  return {
    port,
    messages,
    waitFor(predicate, timeoutMs = 15_000) {
      const found = messages.find(predicate)
      if (found) return Promise.resolve(found)
      return new Promise((resolve, reject) => {
        const waiter = { predicate, resolve: (m: CaughtMail) => { clearTimeout(timer); resolve(m) } }
        const timer = setTimeout(() => {
          waiters.splice(waiters.indexOf(waiter), 1)
          reject(new Error(`No matching mail within ${timeoutMs} ms (caught ${messages.length})`))
        }, timeoutMs)
        waiters.push(waiter)
      })
    },
    close: () => new Promise(resolve => server.close(() => resolve())),
  }
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const url = new URL(process.env.NUXT_MAIL_URL || 'smtp://127.0.0.1:2525')
  const dir = process.env.PERPEND_MAILBOX_DIR || join(process.cwd(), 'var', 'mailbox')
  const catcher = await startMailCatcher({ port: Number(url.port || 2525), host: url.hostname, dir })
  console.log(`Mail catcher listening on ${url.hostname}:${catcher.port}, keeping mail in ${dir}`)
  const stop = () => { void catcher.close().then(() => process.exit(0)) }
  process.on('SIGINT', stop)
  process.on('SIGTERM', stop)
}
