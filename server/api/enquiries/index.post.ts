import { randomBytes } from 'node:crypto'
import { formatWorkingDuration } from '../../../shared/time/working-time'
import { enquiryIntakeSchema } from '../../../shared/schemas/enquiry'
import type { EnquiryIntake } from '../../../shared/schemas/enquiry'
import { Attachment, Enquiry, EnquiryEvent, Organisation, Project, User } from '../../models'
import type { ReceivedForm } from '../../utils/uploads'

/**
 * Intake: the public and signed-in enquiry form, as multipart/form-data (a `data` field holding the form as
 * JSON, and up to 20 `drawings`) or as JSON when there are no drawings. Rows and files are written together:
 * a refused or broken upload leaves neither. Anonymous senders may send 60 an hour from one address.
 */
const anonymousIntakeLimit = {
  bucket: 'intake:anonymous',
  limit: 60,
  windowMs: 60 * 60_000,
  refusal: {
    statusMessage: 'Too many enquiries',
    message: (limit: number, retryText: string) => `At most ${limit} enquiries an hour can be sent from one address without signing in. Sign in, or try again in ${retryText}.`,
  },
}
export default defineEventHandler(async (event) => {
  const caller = await publicRoute(event)
  // An anonymous enquiry mails its acknowledgement to any address typed in: limit what one address may send.
  if (!caller) rateLimit(event, anonymousIntakeLimit)
  let received: ReceivedForm | null = null
  let input: EnquiryIntake
  const isMultipart = (getRequestHeader(event, 'content-type') ?? '').startsWith('multipart/form-data')
  if (isMultipart) {
    received = await receiveMultipart(event, { fileField: 'drawings' })
    try {
      let data: unknown
      try { data = JSON.parse(received.fields.data ?? '') }
      catch { throw createError({ statusCode: 400, statusMessage: 'Invalid input', message: 'The form data is missing or not valid JSON.' }) }
      input = parseWith(enquiryIntakeSchema)(data)
    }
    catch (error) {
      await received.cleanup()
      throw error
    }
  }
  else {
    input = await readValidatedBody(event, parseWith(enquiryIntakeSchema))
  }

  const files = received?.files ?? []
  const keys = files.map(() => newStorageKey())
  const db = useDb()
  try {
    const enquiry = await db.transaction(async (transaction) => {
      let requester: { userId: number | null, name: string, email: string, phone: string | null, organisation: string | null, organisationId: number | null }
      if (caller && !(isStaff(caller) && input.requester)) {
        const user = await User.findByPk(caller.id, { include: [{ model: Organisation, as: 'organisation' }], transaction })
        requester = {
          userId: caller.id,
          name: caller.name,
          email: caller.email,
          phone: user?.phone ?? input.requester?.phone ?? null,
          organisation: (user as User & { organisation?: Organisation })?.organisation?.name ?? null,
          organisationId: caller.role === 'specifier' ? caller.organisationId : null,
        }
      }
      else if (input.requester) {
        requester = { userId: null, name: input.requester.name, email: input.requester.email, phone: input.requester.phone, organisation: input.requester.organisation, organisationId: null }
      }
      else {
        throw createError({ statusCode: 400, statusMessage: 'Invalid input', message: 'requester: Tell us your name, organisation, e-mail and phone, or sign in.' })
      }

      const [project] = requester.organisationId
        ? await Project.findOrCreate({
            where: { organisationId: requester.organisationId, name: input.project.name },
            defaults: projectFields(input, requester.organisationId),
            transaction,
          })
        : [await Project.create(projectFields(input, null), { transaction })]

      const { ref, year, seq } = await allocateReference(transaction)
      const now = new Date()
      const enquiry = await Enquiry.create({
        ref,
        refYear: year,
        refSeq: seq,
        status: 'received',
        topic: input.topic,
        priority: input.priority,
        subject: input.subject,
        question: input.question,
        requesterUserId: requester.userId,
        requesterName: requester.name,
        requesterEmail: requester.email,
        requesterPhone: requester.phone,
        requesterOrganisation: requester.organisation,
        organisationId: requester.organisationId,
        projectId: project.id,
        assigneeId: null,
        receivedAt: now,
        firstResponseAt: null,
        answeredAt: null,
        closedAt: null,
        mergedIntoId: null,
        replyToken: randomBytes(16).toString('hex'),
        firstResponseDueAt: null,
        answerDueAt: null,
        nextDueAt: null,
        waitingSince: null,
      }, { transaction })
      await EnquiryEvent.create({ enquiryId: enquiry.id, actorUserId: caller?.id ?? null, kind: 'status', fromValue: null, toValue: 'received' }, { transaction })
      for (let i = 0; i < files.length; i++) {
        const f = files[i]!
        await Attachment.create({
          enquiryId: enquiry.id,
          messageId: null,
          storageKey: keys[i]!,
          fileName: f.fileName,
          fileType: f.type,
          contentType: f.contentType,
          sizeBytes: f.sizeBytes,
          sha256: f.sha256,
          internal: false,
          uploadedBy: caller?.id ?? null,
        }, { transaction })
      }
      await refreshDueTimes(enquiry, transaction)
      await enquiry.save({ transaction })

      const siteUrl = useRuntimeConfig().siteUrl
      const due = enquiry.firstResponseDueAt ? new Intl.DateTimeFormat('en-IE', { dateStyle: 'full', timeStyle: 'short', timeZone: deskCalendar().timeZone }).format(enquiry.firstResponseDueAt) : null
      const targets = await loadServiceTargets(transaction)
      const mail = acknowledgementMail({
        ref,
        subject: enquiry.subject,
        name: requester.name,
        dueText: due ? `by ${due} (within ${formatWorkingDuration(targets[enquiry.priority as 'normal' | 'urgent'].firstResponseMs)} of working time)` : 'shortly',
        url: `${siteUrl}${requester.userId ? `/my-enquiries/${ref}` : '/'}`,
      })
      await queueMail({ kind: 'acknowledgement', to: requester.email, enquiryId: enquiry.id, headers: { 'Reply-To': replyAddress(enquiry.replyToken!) }, ...mail }, transaction)
      // Files go in last, still inside the transaction: if storing fails the rows roll back with it.
      await storeFiles(files, keys)
      return enquiry
    })
    setResponseStatus(event, 201)
    return { ref: enquiry.ref, firstResponseDueAt: enquiry.firstResponseDueAt, attachments: files.length }
  }
  catch (error) {
    await removeStored(keys)
    throw error
  }
  finally {
    await received?.cleanup()
  }
})

function projectFields(input: EnquiryIntake, organisationId: number | null) {
  return {
    organisationId,
    name: input.project.name,
    siteAddress: input.project.siteAddress ?? null,
    region: input.project.region,
    stage: input.project.stage,
    buildingType: input.project.buildingType ?? null,
    storeys: input.project.storeys ?? null,
    wallAreaM2: input.project.wallAreaM2 ?? null,
  }
}
