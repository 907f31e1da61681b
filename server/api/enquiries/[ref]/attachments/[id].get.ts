import { z } from 'zod'
import { Attachment } from '../../../../models'

const paramsSchema = z.object({ id: z.coerce.number().int().positive('Not a valid attachment id') })
const inlineTypes = new Set(['pdf', 'png', 'jpg', 'webp'])

/** A drawing of an enquiry the caller may see. PDFs and images open inline (sandboxed); the rest download. */
export default defineEventHandler(async (event) => {
  const caller = await requireCaller(event)
  const enquiry = await findEnquiryFor(event, caller)
  const { id } = await getValidatedRouterParams(event, parseWith(paramsSchema))
  const attachment = await Attachment.findOne({ where: { id, enquiryId: enquiry.id, ...(isStaff(caller) ? {} : { internal: false }) } })
  if (!attachment) notFound('attachment')
  const bytes = await useStorage('uploads').getItemRaw<Buffer>(attachment.storageKey)
  if (!bytes) throw createError({ statusCode: 410, statusMessage: 'Gone', message: 'This file is no longer in the store.' })
  const disposition = inlineTypes.has(attachment.fileType) && getQuery(event).download === undefined ? 'inline' : 'attachment'
  setResponseHeaders(event, {
    'Content-Type': attachment.contentType,
    'Content-Length': String(attachment.sizeBytes),
    'Content-Disposition': `${disposition}; filename*=UTF-8''${encodeURIComponent(attachment.fileName)}`,
    'X-Content-Type-Options': 'nosniff',
    'Content-Security-Policy': 'sandbox; default-src \'none\'; img-src \'self\'; style-src \'unsafe-inline\'',
    'Cache-Control': 'private, max-age=3600, immutable',
  })
  return bytes
})
