import { Op } from 'sequelize'
import type { Transaction } from 'sequelize'
import { OutboxMessage } from '../models'
import type { Enquiry } from '../models'
import { mailLayout } from './mail-templates'
import type { RenderedMail } from './mail-templates'

/**
 * Mails about an enquiry. Each carries the enquiry's reference in the subject and a reply address with the
 * enquiry's unguessable token, so an e-mailed answer threads back onto it.
 */

export function replyAddress(replyToken: string): string {
  const from = useRuntimeConfig().mailFrom
  const address = /<([^>]+)>/.exec(from)?.[1] ?? from
  const [local, domain] = address.split('@')
  return `${local}+${replyToken}@${domain}`
}

export function acknowledgementMail(input: { ref: string, subject: string, name: string, dueText: string, url: string }) {
  const paragraphs = [
    `Thank you for your technical query "${input.subject}". Its reference is ${input.ref}; please quote it in any correspondence.`,
    `A technical officer will reply ${input.dueText}. You can follow the enquiry, add drawings and reply online, or simply reply to this e-mail.`,
  ]
  return {
    subject: `${input.ref} received: ${input.subject}`,
    text: [`Dear ${input.name},`, '', ...paragraphs.flatMap(p => [p, '']), `Follow the enquiry: ${input.url}`, '', '-- ', 'Corrstone technical department (invented demonstration company)'].join('\n'),
    html: mailLayout(`We have your query ${input.ref}`, [`Dear ${input.name},`, ...paragraphs], { label: 'Follow the enquiry', url: input.url }),
  }
}

export function replyMail(input: { ref: string, subject: string, name: string, officer: string, body: string, url: string }) {
  const lines = input.body.split(/\r?\n/)
  return {
    subject: `Re: ${input.ref} ${input.subject}`,
    text: [`Dear ${input.name},`, '', ...lines, '', `${input.officer}`, 'Corrstone technical department', '', `The enquiry online: ${input.url}`, '', '-- ', 'Reply to this e-mail to answer; your reply is added to the enquiry.'].join('\n'),
    html: mailLayout(`${input.ref}: a reply from the technical department`, [`Dear ${input.name},`, ...lines.filter(l => l.trim()), input.officer], { label: 'Open the enquiry', url: input.url }),
  }
}

export function reminderMail(input: { ref: string, subject: string, name: string, waitingSince: string, question: string | null, url: string }) {
  const paragraphs = [
    `Your technical query ${input.ref} "${input.subject}" has been waiting for your answer since ${input.waitingSince}.`,
    ...(input.question ? [`What we asked: ${input.question}`] : []),
    'Reply to this e-mail or answer online and the officer carries on where they left off. If you no longer need an answer, a short reply saying so lets us close it.',
  ]
  return {
    subject: `${input.ref} is waiting for you: ${input.subject}`,
    text: [`Dear ${input.name},`, '', ...paragraphs.flatMap(p => [p, '']), `Answer online: ${input.url}`, '', '-- ', 'Corrstone technical department (invented demonstration company)'].join('\n'),
    html: mailLayout(`${input.ref} is waiting for your answer`, [`Dear ${input.name},`, ...paragraphs], { label: 'Answer online', url: input.url }),
  }
}

export function closedMail(input: { ref: string, subject: string, name: string, officer: string, url: string }) {
  const paragraphs = [
    `We have closed your technical query ${input.ref} "${input.subject}". Everything we sent stays available online.`,
    'If something is still open, reply to this e-mail within the next weeks: the enquiry is reopened and comes back to the technical department.',
  ]
  return {
    subject: `${input.ref} closed: ${input.subject}`,
    text: [`Dear ${input.name},`, '', ...paragraphs.flatMap(p => [p, '']), input.officer, 'Corrstone technical department', '', `The enquiry online: ${input.url}`, '', '-- ', 'Corrstone technical department (invented demonstration company)'].join('\n'),
    html: mailLayout(`${input.ref} is closed`, [`Dear ${input.name},`, ...paragraphs, input.officer], { label: 'Open the enquiry', url: input.url }),
  }
}

/** Where the requester follows an enquiry: their own page when they have an account, the public start otherwise. */
export function requesterUrl(enquiry: Pick<Enquiry, 'ref' | 'requesterUserId'>): string {
  const siteUrl = useRuntimeConfig().siteUrl
  return enquiry.requesterUserId ? `${siteUrl}/my-enquiries/${enquiry.ref}` : `${siteUrl}/`
}

/**
 * Queues a mail to the enquiry's requester in the caller's transaction, threaded after every earlier mail on
 * the enquiry (In-Reply-To / References, RFC 5322 §3.6.4) and with the enquiry's reply address.
 */
export async function queueEnquiryMail(enquiry: Enquiry, kind: string, mail: RenderedMail, transaction: Transaction, attachmentIds: number[] = []) {
  const previous = await OutboxMessage.findAll({ where: { enquiryId: enquiry.id, status: { [Op.ne]: 'failed' } }, attributes: ['messageId'], order: [['id', 'ASC']], transaction })
  const references = previous.map(p => p.messageId)
  return queueMail({
    kind, to: enquiry.requesterEmail, enquiryId: enquiry.id, ...mail, attachmentIds,
    headers: {
      ...(enquiry.replyToken ? { 'Reply-To': replyAddress(enquiry.replyToken) } : {}),
      ...(references.length ? { 'In-Reply-To': references.at(-1)!, 'References': references.join(' ') } : {}),
    },
  }, transaction)
}
