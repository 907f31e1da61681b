import { messageInputSchema } from '../../../../shared/schemas/enquiry'
import { uploadLimits } from '../../../../shared/types/enquiry'
import { Attachment, EnquiryMessage } from '../../../models'
import type { ReceivedForm } from '../../../utils/uploads'

/**
 * Adds to the thread. Staff write replies (e-mailed to the requester) or internal notes (never shown or sent
 * to the requester); the requester's side writes messages, with more drawings if they like. A requester's
 * message moves a waiting enquiry back to "in hand" and reopens an answered or closed one.
 * JSON, or multipart/form-data with a `data` field (JSON) and `files`.
 */
export default defineEventHandler(async (event) => {
  const caller = await requireCaller(event)
  const enquiry = await findEnquiryFor(event, caller)
  const staff = isStaff(caller)

  let received: ReceivedForm | null = null
  let input: { kind?: 'reply' | 'note' | 'requester', body: string }
  if ((getRequestHeader(event, 'content-type') ?? '').startsWith('multipart/form-data')) {
    const stored = await Attachment.findAll({ where: { enquiryId: enquiry.id }, attributes: ['sizeBytes'] })
    received = await receiveMultipart(event, { fileField: 'files', alreadyStoredFiles: stored.length, alreadyStoredBytes: stored.reduce((s, a) => s + a.sizeBytes, 0) })
    try {
      let data: unknown
      try { data = JSON.parse(received.fields.data ?? '') }
      catch { throw createError({ statusCode: 400, statusMessage: 'Invalid input', message: 'The message data is missing or not valid JSON.' }) }
      input = parseWith(messageInputSchema)(data)
    }
    catch (error) {
      await received.cleanup()
      throw error
    }
  }
  else {
    input = await readValidatedBody(event, parseWith(messageInputSchema))
  }

  const kind = staff ? (input.kind ?? 'note') : 'requester'
  if (staff && kind === 'requester') {
    await received?.cleanup()
    throw createError({ statusCode: 400, statusMessage: 'Invalid input', message: 'kind: Staff write a reply or an internal note.' })
  }
  if (enquiry.mergedIntoId) {
    await received?.cleanup()
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'This enquiry was merged into another; write on that one instead.' })
  }
  const files = received?.files ?? []
  if (files.length > uploadLimits.maxFiles) throw createError({ statusCode: 400, statusMessage: 'Too many files', message: `At most ${uploadLimits.maxFiles} files.` })
  const keys = files.map(() => newStorageKey())
  const db = useDb()
  try {
    const message = await db.transaction(async (transaction) => {
      await enquiry.reload({ transaction, lock: transaction.LOCK.UPDATE })
      const now = new Date()
      const message = await EnquiryMessage.create({ enquiryId: enquiry.id, kind, authorUserId: caller.id, authorName: caller.name, body: input.body, source: 'web', createdAt: now }, { transaction })
      for (let i = 0; i < files.length; i++) {
        const f = files[i]!
        await Attachment.create({
          enquiryId: enquiry.id, messageId: message.id, storageKey: keys[i]!, fileName: f.fileName, fileType: f.type,
          contentType: f.contentType, sizeBytes: f.sizeBytes, sha256: f.sha256, internal: kind === 'note', uploadedBy: caller.id,
        }, { transaction })
      }
      if (kind === 'requester') await resumeOnRequesterMessage(enquiry, caller.id, now, transaction)
      if (kind === 'reply') {
        enquiry.firstResponseAt ??= now
        const mail = replyMail({
          ref: enquiry.ref, subject: enquiry.subject, name: enquiry.requesterName, officer: caller.name, body: input.body,
          url: `${useRuntimeConfig().siteUrl}/my-enquiries/${enquiry.ref}`,
        })
        await queueEnquiryMail(enquiry, 'reply', mail, transaction)
      }
      enquiry.lastActivityAt = now
      await refreshDueTimes(enquiry, transaction)
      await enquiry.save({ transaction })
      await storeFiles(files, keys)
      return message
    })
    setResponseStatus(event, 201)
    return { id: message.id, kind: message.kind, status: enquiry.status, attachments: files.length }
  }
  catch (error) {
    await removeStored(keys)
    throw error
  }
  finally {
    await received?.cleanup()
  }
})
