import { randomUUID } from 'node:crypto'
import nodemailer from 'nodemailer'
import type { Transporter } from 'nodemailer'
import type { Transaction } from 'sequelize'
import { QueryTypes } from 'sequelize'
import { Attachment, OutboxMessage } from '../models'

/**
 * The one mail layer. A message is written to the outbox in the same transaction as the change that causes
 * it; the worker (server/plugins/outbox.ts) delivers it with retries, so a mail server that is down loses
 * nothing and a message saved but not yet sent goes out once it is reachable.
 */

export interface OutgoingMail {
  kind: string
  to: string
  subject: string
  text: string
  html?: string
  enquiryId?: number
  headers?: Record<string, string>
  /** Stored attachments (their ids) to send with the message; read from the upload store at delivery. */
  attachmentIds?: number[]
}

const MAX_ATTEMPTS = 8
let transport: Transporter | null = null
let transportUrl = ''

function mailDomain(): string {
  const from = useRuntimeConfig().mailFrom
  return /@([^>\s]+)/.exec(from)?.[1] ?? 'perpend.invalid'
}

export function newMessageId(): string {
  return `<${randomUUID()}@${mailDomain()}>`
}

export async function queueMail(mail: OutgoingMail, transaction?: Transaction): Promise<OutboxMessage> {
  useDb()
  const row = await OutboxMessage.create({
    kind: mail.kind,
    toAddress: mail.to,
    subject: mail.subject,
    textBody: mail.text,
    htmlBody: mail.html ?? null,
    headers: mail.headers ? JSON.stringify(mail.headers) : null,
    messageId: mail.headers?.['Message-ID'] ?? newMessageId(),
    enquiryId: mail.enquiryId ?? null,
    attachmentIds: mail.attachmentIds?.length ? JSON.stringify(mail.attachmentIds) : null,
    lastError: null,
    sentAt: null,
  }, { transaction })
  const kick = () => { void deliverDueMail().catch(() => {}) }
  if (transaction) transaction.afterCommit(kick)
  else kick()
  return row
}

function getTransport(): Transporter {
  const url = useRuntimeConfig().mailUrl
  if (!transport || transportUrl !== url) {
    transport = nodemailer.createTransport(url, { from: useRuntimeConfig().mailFrom })
    transportUrl = url
  }
  return transport
}

/** The files a message carries, from the upload store. A missing file fails the attempt, so it is retried, never sent without. */
async function storedAttachments(message: OutboxMessage) {
  if (!message.attachmentIds) return undefined
  const ids = JSON.parse(message.attachmentIds) as number[]
  const rows = await Attachment.findAll({ where: { id: ids } })
  return Promise.all(ids.map(async (id) => {
    const row = rows.find(r => r.id === id)
    const bytes = row ? await useStorage('uploads').getItemRaw<Buffer>(row.storageKey) : null
    if (!row || !bytes) throw new Error(`attachment ${id} is not in the upload store`)
    return { filename: row.fileName, content: Buffer.from(bytes), contentType: row.contentType }
  }))
}

let running: Promise<number> | null = null

/** Sends what is due. Rows are claimed with SKIP LOCKED and a lease, so several servers never send one twice. */
export function deliverDueMail(): Promise<number> {
  if (!running) running = deliverBatch().finally(() => { running = null })
  return running
}

async function deliverBatch(): Promise<number> {
  const db = useDb()
  const claimed = await db.transaction(async (t) => {
    const rows = await db.query<{ id: number }>(
      `SELECT id FROM outbox_messages WHERE status = 'pending' AND next_attempt_at <= NOW(3)
       ORDER BY id LIMIT 20 FOR UPDATE SKIP LOCKED`,
      { type: QueryTypes.SELECT, transaction: t },
    )
    if (rows.length === 0) return []
    const ids = rows.map(r => r.id)
    // Lease: a server that dies mid-send leaves the row to be picked up again a minute later.
    await OutboxMessage.update({ nextAttemptAt: new Date(Date.now() + 60_000) }, { where: { id: ids }, transaction: t })
    return ids
  })
  let sent = 0
  for (const id of claimed) {
    const message = await OutboxMessage.findByPk(id)
    if (!message || message.status !== 'pending') continue
    try {
      await getTransport().sendMail({
        from: useRuntimeConfig().mailFrom,
        to: message.toAddress,
        subject: message.subject,
        text: message.textBody,
        html: message.htmlBody ?? undefined,
        messageId: message.messageId,
        headers: message.headers ? JSON.parse(message.headers) as Record<string, string> : undefined,
        attachments: await storedAttachments(message),
      })
      await message.update({ status: 'sent', sentAt: new Date(), attempts: message.attempts + 1, lastError: null })
      sent++
    }
    catch (error) {
      const attempts = message.attempts + 1
      const backoff = Math.min(30 * 60_000, 5_000 * 2 ** (attempts - 1))
      await message.update({
        attempts,
        status: attempts >= MAX_ATTEMPTS ? 'failed' : 'pending',
        nextAttemptAt: new Date(Date.now() + backoff),
        lastError: String((error as Error).message ?? error).slice(0, 500),
      })
    }
  }
  return sent
}
