import { createHash, randomUUID } from 'node:crypto'
import { mkdir, rm, writeFile } from 'node:fs/promises'
import { join } from 'node:path'
import { simpleParser } from 'mailparser'
import type { AddressObject, Attachment as MailAttachment, ParsedMail } from 'mailparser'
import { uploadLimits } from '../../shared/types/enquiry'
import { Attachment, Enquiry, EnquiryMessage, InboundQuarantine, OutboxMessage, User } from '../models'
import type { QuarantineReason } from '../models/inbound-quarantine'
import type { ReceivedFile } from './uploads'

/**
 * E-mail in: a requester's answer to one of our mails, from the local SMTP listener
 * (server/plugins/inbound-smtp.ts) or the mail provider's inbound hook (server/api/mail/inbound.post.ts).
 * It is threaded onto its enquiry only when it names one (the reply token, else the thread headers) and
 * comes from someone the enquiry knows; everything else waits in inbound_quarantine for an officer.
 * Mail never creates an enquiry.
 */

/** Largest inbound message accepted, headers and encoding included. */
export const inboundMaxBytes = 300 * 1024 * 1024

export interface InboundEnvelope {
  mailFrom?: string | null
  rcptTo?: string[]
  /** The message as it arrived; kept with a held mail so that an officer's "attach" brings its files along. */
  raw?: Buffer
}

export type InboundOutcome =
  | { outcome: 'threaded', ref: string, messageId: number, stored: number, refused: string[] }
  | { outcome: 'quarantined', reason: QuarantineReason, quarantineId: number }

const MAX_BODY_CHARS = 20_000
const MAX_HELD_TEXT_CHARS = 1_000_000
const tokenPattern = /\+([0-9a-f]{32})@/i

function addressList(value: AddressObject | AddressObject[] | undefined): { address: string, name: string }[] {
  const objects = value ? (Array.isArray(value) ? value : [value]) : []
  const out: { address: string, name: string }[] = []
  const walk = (entries: AddressObject['value']) => {
    for (const e of entries) {
      if (e.address) out.push({ address: e.address.toLowerCase(), name: e.name ?? '' })
      if (e.group) walk(e.group)
    }
  }
  for (const o of objects) walk(o.value)
  return out
}

function recipients(parsed: ParsedMail, envelope: InboundEnvelope): string[] {
  const all = [...addressList(parsed.to).map(a => a.address), ...addressList(parsed.cc).map(a => a.address), ...(envelope.rcptTo ?? []).map(a => a.toLowerCase())]
  return [...new Set(all)]
}

function headerText(parsed: ParsedMail, name: string): string {
  const value = parsed.headers.get(name) as unknown
  if (typeof value === 'string') return value
  if (value && typeof value === 'object' && 'value' in value) return String((value as { value: unknown }).value)
  return ''
}

/** RFC 3834 automatic responses (out-of-office, delivery reports) must not reopen an enquiry or start a mail loop. */
function isAutomatic(parsed: ParsedMail): boolean {
  const autoSubmitted = headerText(parsed, 'auto-submitted').trim().toLowerCase()
  if (autoSubmitted && autoSubmitted !== 'no') return true
  if (/^(bulk|junk|list|auto_reply)$/i.test(headerText(parsed, 'precedence').trim())) return true
  return headerText(parsed, 'x-autoreply') !== ''
}

/** Follows merges so that an answer to a duplicate lands on the enquiry it was merged into. */
async function followMerges(enquiry: Enquiry | null): Promise<Enquiry | null> {
  let current = enquiry
  for (let hop = 0; current?.mergedIntoId && hop < 5; hop++) current = await Enquiry.findByPk(current.mergedIntoId)
  return current
}

/** The enquiry a mail answers: the reply token in a recipient address, failing that the thread headers. */
async function matchEnquiry(parsed: ParsedMail, to: string[]): Promise<Enquiry | null> {
  const tokens = to.map(a => tokenPattern.exec(a)?.[1]?.toLowerCase()).filter((t): t is string => !!t)
  if (tokens.length) {
    const byToken = await Enquiry.findOne({ where: { replyToken: [...new Set(tokens)] } })
    if (byToken) return followMerges(byToken)
  }
  const references = Array.isArray(parsed.references) ? parsed.references.join(' ') : parsed.references ?? ''
  const ids = [...new Set(`${parsed.inReplyTo ?? ''} ${references}`.match(/<[^<>\s]+>/g) ?? [])].slice(0, 50)
  if (!ids.length) return null
  const sent = await OutboxMessage.findOne({ where: { messageId: ids }, attributes: ['enquiryId'], order: [['id', 'DESC']] })
  return sent?.enquiryId ? followMerges(await Enquiry.findByPk(sent.enquiryId)) : null
}

/**
 * Whether the From address belongs on this enquiry: the requester's own address, or an active account of
 * the enquiry's organisation (a colleague answering for the requester), or the requester's account.
 */
async function identifySender(enquiry: Enquiry, from: { address: string, name: string } | undefined) {
  if (!from) return { known: false, user: null, name: '' }
  const user = await User.findOne({ where: { email: from.address } })
  const activeUser = user && !user.deactivatedAt && user.email.toLowerCase() === from.address ? user : null
  const isRequester = enquiry.requesterEmail.toLowerCase() === from.address
  const ofEnquiry = !!activeUser && (activeUser.id === enquiry.requesterUserId || (!!enquiry.organisationId && activeUser.organisationId === enquiry.organisationId))
  const matchedUser = ofEnquiry ? activeUser : null
  return {
    known: isRequester || ofEnquiry,
    user: matchedUser,
    name: matchedUser?.name ?? (isRequester ? enquiry.requesterName : from.name || from.address),
  }
}

/**
 * The answer without the history an e-mail client quotes below it: quoted lines ("> …"), and everything from
 * an attribution line ("On … wrote:"), an "Original Message" divider or a forwarded header block
 * ("From: …" after a blank line, followed by Sent:/Date:/To:/Subject:).
 */
export function stripQuotedHistory(text: string): string {
  const lines = text.replace(/\r\n?/g, '\n').split('\n')
  const kept: string[] = []
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i]!.trim()
    const next = lines[i + 1]?.trim() ?? ''
    if (/^-{2,}\s*Original Message\s*-{2,}$/i.test(line)) break
    // Clients wrap a long attribution ("On Tue, 3 Mar 2026 at 10:12, A Person <a@b> wrote:") over two lines.
    if (/^On\s/.test(line) && (/wrote:$/.test(line) || /wrote:$/.test(next))) break
    if (/^From:\s*\S/i.test(line) && i > 0 && lines[i - 1]!.trim() === ''
      && lines.slice(i + 1, i + 6).some(l => /^(Sent|Date|To|Subject):/i.test(l.trim()))) break
    if (line.startsWith('>')) continue
    kept.push(lines[i]!.replace(/\s+$/, ''))
  }
  while (kept.length && !kept.at(-1)) kept.pop()
  while (kept.length && !kept[0]) kept.shift()
  return kept.join('\n').replace(/\n{3,}/g, '\n\n')
}

function shownName(name: string | undefined): string {
  // eslint-disable-next-line no-control-regex
  return (name ?? 'unnamed attachment').replace(/[\u0000-\u001f\u007f"]/g, '').slice(0, 120) || 'unnamed attachment'
}

interface ReceivedMailFiles {
  files: ReceivedFile[]
  refused: string[]
  cleanup: () => Promise<void>
}

/**
 * Puts a mail's attachments through the checks the upload form applies: each written to a temporary file,
 * its type recognised from its bytes, the same size and count limits. A refused file is named with the reason.
 */
async function receiveMailFiles(attachments: MailAttachment[], already: { files: number, bytes: number }): Promise<ReceivedMailFiles> {
  const dir = join(uploadRoot(), '.incoming', randomUUID())
  await mkdir(dir, { recursive: true })
  const cleanup = () => rm(dir, { recursive: true, force: true })
  const files: ReceivedFile[] = []
  const refused: string[] = []
  let bytes = already.bytes
  const mb = (n: number) => `${n / 1024 / 1024} MB`
  try {
    for (const a of attachments) {
      const name = shownName(a.filename)
      const size = a.content.length
      if (size === 0) { refused.push(`"${name}": the file is empty`); continue }
      if (size > uploadLimits.maxFileBytes) { refused.push(`"${name}": larger than ${mb(uploadLimits.maxFileBytes)}`); continue }
      if (already.files + files.length >= uploadLimits.maxFiles) { refused.push(`"${name}": the enquiry already has ${uploadLimits.maxFiles} files`); continue }
      if (bytes + size > uploadLimits.maxTotalBytes) { refused.push(`"${name}": the enquiry's files would add up to more than ${mb(uploadLimits.maxTotalBytes)}`); continue }
      const tmpPath = join(dir, randomUUID())
      await writeFile(tmpPath, a.content)
      const detected = await detectFileType(tmpPath)
      if (!detected) {
        refused.push(`"${name}": not a PDF, image (PNG, JPEG, WebP), DWG, DXF, IFC or ZIP file`)
        await rm(tmpPath, { force: true })
        continue
      }
      bytes += size
      files.push({
        tmpPath,
        fileName: safeFileName(a.filename, detected.type),
        type: detected.type,
        contentType: detected.contentType,
        sizeBytes: size,
        sha256: createHash('sha256').update(a.content).digest('hex'),
      })
    }
    return { files, refused, cleanup }
  }
  catch (error) {
    await cleanup()
    throw error
  }
}

function messageBody(text: string, stored: number, refused: string[]): string {
  let body = stripQuotedHistory(text)
  if (body.length > MAX_BODY_CHARS) body = `${body.slice(0, MAX_BODY_CHARS)}\n\n[The rest of the e-mail was cut: at most ${MAX_BODY_CHARS.toLocaleString('en-IE')} characters are kept.]`
  if (!body) body = stored ? '(The e-mail had no text, only attachments.)' : '(The e-mail had no text.)'
  if (refused.length) body += `\n\nAttachments not kept (refused on arrival):\n${refused.map(r => `- ${r}`).join('\n')}`
  return body
}

export interface ThreadedMail {
  ref: string
  messageId: number
  stored: number
  refused: string[]
}

/**
 * Adds a mail to an enquiry as the requester's message, with its accepted attachments, and moves the
 * enquiry on as a web message would (resumeOnRequesterMessage).
 */
export async function threadInboundMail(
  enquiry: Enquiry,
  mail: { text: string, attachments: MailAttachment[] },
  who: { authorUserId: number | null, authorName: string, actorUserId: number | null },
): Promise<ThreadedMail> {
  const db = useDb()
  const existing = await Attachment.findAll({ where: { enquiryId: enquiry.id }, attributes: ['sizeBytes'] })
  const received = await receiveMailFiles(mail.attachments, { files: existing.length, bytes: existing.reduce((s, a) => s + a.sizeBytes, 0) })
  const keys = received.files.map(() => newStorageKey())
  try {
    const message = await db.transaction(async (transaction) => {
      await enquiry.reload({ transaction, lock: transaction.LOCK.UPDATE })
      const now = new Date()
      const message = await EnquiryMessage.create({
        enquiryId: enquiry.id, kind: 'requester', authorUserId: who.authorUserId, authorName: who.authorName.slice(0, 200),
        body: messageBody(mail.text, received.files.length, received.refused), source: 'email', createdAt: now,
      }, { transaction })
      for (let i = 0; i < received.files.length; i++) {
        const f = received.files[i]!
        await Attachment.create({
          enquiryId: enquiry.id, messageId: message.id, storageKey: keys[i]!, fileName: f.fileName, fileType: f.type,
          contentType: f.contentType, sizeBytes: f.sizeBytes, sha256: f.sha256, internal: false, uploadedBy: who.authorUserId,
        }, { transaction })
      }
      await resumeOnRequesterMessage(enquiry, who.actorUserId, now, transaction)
      enquiry.lastActivityAt = now
      await refreshDueTimes(enquiry, transaction)
      await enquiry.save({ transaction })
      await storeFiles(received.files, keys)
      return message
    })
    return { ref: enquiry.ref, messageId: message.id, stored: received.files.length, refused: received.refused }
  }
  catch (error) {
    await removeStored(keys)
    throw error
  }
  finally {
    await received.cleanup()
  }
}

async function hold(parsed: ParsedMail, envelope: InboundEnvelope, to: string[], reason: QuarantineReason, enquiryId: number | null): Promise<InboundOutcome> {
  const rawKey = envelope.raw ? `inbound:${randomUUID()}` : null
  if (rawKey) await useStorage('uploads').setItemRaw(rawKey, envelope.raw)
  try {
    const from = addressList(parsed.from)[0]?.address ?? envelope.mailFrom ?? ''
    const row = await InboundQuarantine.create({
      fromAddress: from.slice(0, 254),
      toAddresses: to.join(', ').slice(0, 1000),
      subject: (parsed.subject ?? '').slice(0, 300),
      reason,
      rawSize: envelope.raw?.length ?? (parsed.text ?? '').length + parsed.attachments.reduce((s, a) => s + a.size, 0),
      rawKey,
      messageId: parsed.messageId?.slice(0, 250) ?? null,
      textBody: (parsed.text ?? '').slice(0, MAX_HELD_TEXT_CHARS),
      attachmentList: parsed.attachments.length
        ? JSON.stringify(parsed.attachments.map(a => ({ name: shownName(a.filename), contentType: a.contentType, size: a.size })))
        : null,
      enquiryId,
    })
    return { outcome: 'quarantined', reason, quarantineId: row.id }
  }
  catch (error) {
    if (rawKey) await removeStored([rawKey])
    throw error
  }
}

/** Threads an inbound mail onto the enquiry it answers, or holds it for an officer. Never creates an enquiry. */
export async function processInboundMail(parsed: ParsedMail, envelope: InboundEnvelope = {}): Promise<InboundOutcome> {
  useDb()
  const to = recipients(parsed, envelope)
  const enquiry = await matchEnquiry(parsed, to)
  if (!enquiry) return hold(parsed, envelope, to, 'no-match', null)
  if (isAutomatic(parsed)) return hold(parsed, envelope, to, 'auto-reply', enquiry.id)
  const sender = await identifySender(enquiry, addressList(parsed.from)[0])
  if (!sender.known) return hold(parsed, envelope, to, 'unknown-sender', enquiry.id)
  const threaded = await threadInboundMail(enquiry, { text: parsed.text ?? '', attachments: parsed.attachments }, {
    authorUserId: sender.user?.id ?? null, authorName: sender.name, actorUserId: sender.user?.id ?? null,
  })
  return { outcome: 'threaded', ...threaded }
}

/**
 * An officer's "attach": threads a held mail onto the enquiry they chose, as the requester's message, with
 * its attachments checked as on arrival. The row is claimed first (held → released) so two officers
 * deciding at once cannot thread it twice; if threading fails the claim is undone.
 */
export async function releaseHeldMail(row: InboundQuarantine, enquiry: Enquiry, officerId: number): Promise<ThreadedMail | null> {
  const [claimed] = await InboundQuarantine.update(
    { status: 'released', decidedBy: officerId, decidedAt: new Date(), enquiryId: enquiry.id },
    { where: { id: row.id, status: 'held' } },
  )
  if (!claimed) return null
  try {
    const raw = row.rawKey ? await useStorage('uploads').getItemRaw<Buffer>(row.rawKey) : null
    const parsed = raw ? await simpleParser(Buffer.from(raw)) : null
    const from = parsed ? addressList(parsed.from)[0] : { address: row.fromAddress, name: '' }
    const sender = await identifySender(enquiry, from)
    const threaded = await threadInboundMail(
      enquiry,
      { text: parsed?.text ?? row.textBody, attachments: parsed?.attachments ?? [] },
      {
        authorUserId: sender.user?.id ?? null,
        authorName: sender.known ? sender.name : (from?.name ? `${from.name} <${from.address}>` : from?.address || row.fromAddress),
        actorUserId: officerId,
      },
    )
    if (row.rawKey) await removeStored([row.rawKey])
    return threaded
  }
  catch (error) {
    await InboundQuarantine.update({ status: 'held', decidedBy: null, decidedAt: null, enquiryId: row.enquiryId }, { where: { id: row.id } })
    throw error
  }
}
