import { simpleParser } from 'mailparser'
import { SMTPServer } from 'smtp-server'

/**
 * The inbound SMTP listener: requesters' answers to our mails arrive here (in development straight from the
 * mail client or a test; in production a relay on the same host forwards them, or the provider calls
 * /api/mail/inbound instead). Off unless NUXT_INBOUND_SMTP_PORT is set; loopback only, no AUTH or STARTTLS —
 * the relay in front of it does those.
 */
export default defineNitroPlugin((nitroApp) => {
  if (import.meta.prerender) return
  const port = Number(useRuntimeConfig().inboundSmtpPort) || 0
  if (!port) return

  const server = new SMTPServer({
    banner: 'Perpend inbound mail',
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    size: inboundMaxBytes,
    // Over the limit the server answers 552 (5.3.4) itself, whatever onData reports.
    rejectOversized: true,
    onData(stream, session, callback) {
      const chunks: Buffer[] = []
      stream.on('data', (chunk: Buffer) => { if (!stream.sizeExceeded) chunks.push(chunk) })
      stream.on('end', () => {
        if (stream.sizeExceeded) {
          callback(Object.assign(new Error('Message too large: at most 300 MB'), { responseCode: 552 }))
          return
        }
        const raw = Buffer.concat(chunks)
        simpleParser(raw)
          .then(parsed => processInboundMail(parsed, {
            raw,
            mailFrom: session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
            rcptTo: session.envelope.rcptTo.map(r => r.address),
          }))
          .then(() => callback(), (error: Error) => {
            console.error('[inbound-smtp] could not take a message:', error.message)
            // A temporary failure: the sending server keeps the message and tries again.
            callback(Object.assign(new Error('Temporary failure, please try again later'), { responseCode: 451 }))
          })
      })
    },
  })
  server.on('error', error => console.error('[inbound-smtp]', error.message))
  server.listen(port, '127.0.0.1')
  nitroApp.hooks.hook('close', () => new Promise<void>(resolve => server.close(() => resolve())))
})
