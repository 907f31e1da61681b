import nodemailer from 'nodemailer'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startMailCatcher } from '../../scripts/mail-catcher'
import type { MailCatcher } from '../../scripts/mail-catcher'

describe('local mail catcher', () => {
  let catcher: MailCatcher
  beforeAll(async () => { catcher = await startMailCatcher({ port: 0 }) })
  afterAll(async () => { await catcher.close() })

  it('receives a message sent through nodemailer and parses it back', async () => {
    const transport = nodemailer.createTransport({ host: '127.0.0.1', port: catcher.port, secure: false, ignoreTLS: true })
    const info = await transport.sendMail({
      from: 'desk@perpend.invalid',
      to: 'architect@example.invalid',
      subject: 'TQ-2026-0001 received',
      text: 'We have your query and will answer within two working days.',
      attachments: [{ filename: 'note.txt', content: 'plain attachment' }],
    })
    const mail = await catcher.waitFor(m => m.subject === 'TQ-2026-0001 received')
    expect(mail.envelopeTo).toEqual(['architect@example.invalid'])
    expect(mail.text.trim()).toBe('We have your query and will answer within two working days.')
    expect(mail.headers['message-id']).toBe(info.messageId)
    expect(mail.attachments).toHaveLength(1)
    expect(mail.attachments[0]!.content.toString()).toBe('plain attachment')
  })
})
