import { mailLayout } from './mail-templates'

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
