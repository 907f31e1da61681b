import { simpleParser } from 'mailparser'

/**
 * The mail provider's inbound hook: the raw RFC 822 message as the body, authenticated by the shared secret
 * header (no session; exempt from the same-origin check for that reason). The same processing as the SMTP
 * listener. Answers 200 when the mail was threaded onto an enquiry, 202 when it was held for an officer.
 */
export default defineEventHandler(async (event) => {
  requireInboundSecret(event)
  const type = (getRequestHeader(event, 'content-type') ?? '').split(';')[0]!.trim().toLowerCase()
  if (type !== 'message/rfc822' && type !== 'text/plain') {
    throw createError({ statusCode: 415, statusMessage: 'Unsupported media type', message: 'Send the raw message as message/rfc822.' })
  }
  const tooLarge = () => createError({ statusCode: 413, statusMessage: 'Message too large', message: 'A message may be at most 300 MB.' })
  if (Number(getRequestHeader(event, 'content-length') ?? 0) > inboundMaxBytes) throw tooLarge()
  const raw = await readRawBody(event, false)
  if (!raw?.length) throw createError({ statusCode: 400, statusMessage: 'Invalid input', message: 'The message is empty.' })
  if (raw.length > inboundMaxBytes) throw tooLarge()
  const parsed = await simpleParser(raw)
  const result = await processInboundMail(parsed, { raw })
  setResponseStatus(event, result.outcome === 'threaded' ? 200 : 202)
  return result
})
