/**
 * A message the local mail catcher (scripts/mail-catcher.ts) keeps: the fields its JSON files hold and the
 * development mailbox reads back. The catcher's own copies add each attachment's bytes.
 */
export interface StoredMailAttachment {
  filename: string | null
  contentType: string
  size: number
}

export interface StoredMail<A extends StoredMailAttachment = StoredMailAttachment> {
  id: string
  receivedAt: string
  envelopeFrom: string | null
  envelopeTo: string[]
  from: string
  to: string
  subject: string
  text: string
  html: string | null
  headers: Record<string, string>
  attachments: A[]
}
