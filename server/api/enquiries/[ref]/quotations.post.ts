import { createHash } from 'node:crypto'
import { buildQuotation, createQuotationSchema } from '../../../../shared/workbench/quotation'
import { Attachment, Organisation, Quotation, User } from '../../../models'

/**
 * Prices a quotation on the server from the wall's quantities and the current price book, saves it as the
 * enquiry's next revision (A, B, …) and files its PDF as an attachment. A saved revision is never changed.
 */
export default defineEventHandler(async (event) => {
  const caller = await requireStaff(event)
  await findEnquiryFor(event, caller)
  const body = await readValidatedBody(event, parseWith(createQuotationSchema))
  const db = useDb()
  const storageKey = newStorageKey()
  let stored = false
  try {
    const saved = await db.transaction(async (transaction) => {
      // The lock on the enquiry serialises revisions: two officers saving at once get A and B, not two As.
      const enquiry = await findEnquiryFor(event, caller, { transaction, lock: true })
      const book = await loadPriceBook(transaction)
      const draft = runCalc(() => buildQuotation(body, book))
      const revision = await nextQuotationRevision(enquiry.id, transaction)
      const organisation = enquiry.organisationId ? await Organisation.findByPk(enquiry.organisationId, { transaction }) : null
      const issuedOn = new Date().toISOString().slice(0, 10)
      const pdf = await renderQuotationPdf({
        enquiryRef: enquiry.ref,
        subject: enquiry.subject,
        requester: enquiry.requesterName,
        organisation: organisation?.name ?? enquiry.requesterOrganisation,
        revision,
        validUntil: body.validUntil,
        officer: caller.name,
        issuedOn,
        quote: draft.quote,
        unpriced: draft.unpriced,
        notes: draft.quantities.notes,
      })
      await useStorage('uploads').setItemRaw(storageKey, pdf)
      stored = true
      const attachment = await Attachment.create({
        enquiryId: enquiry.id,
        messageId: null,
        storageKey,
        fileName: `${enquiry.ref}-quotation-${revision}.pdf`,
        fileType: 'pdf',
        contentType: 'application/pdf',
        sizeBytes: pdf.length,
        sha256: createHash('sha256').update(pdf).digest('hex'),
        internal: false,
        uploadedBy: caller.id,
      }, { transaction })
      const q = draft.quote
      const quotation = await Quotation.create({
        enquiryId: enquiry.id,
        revision,
        scope: q.scope,
        inputs: JSON.stringify(body),
        lines: JSON.stringify(q.lines),
        discountPercent: q.discountPercent,
        vatPercent: q.vatRatePercent,
        validUntil: body.validUntil,
        subtotalCents: q.subtotal_cents,
        discountCents: q.discount_cents,
        deliveryCents: q.delivery_cents,
        vatCents: q.vat_cents,
        totalCents: q.total_cents,
        createdBy: caller.id,
        attachmentId: attachment.id,
      }, { transaction })
      await recordAudit(event, {
        actorUserId: caller.id,
        action: 'quotation.saved',
        subjectType: 'enquiry',
        subjectId: enquiry.id,
        detail: { quotationId: quotation.id, revision, totalCents: q.total_cents, attachmentId: attachment.id },
      }, transaction)
      const full = await Quotation.findByPk(quotation.id, { include: [{ model: User, as: 'author', attributes: ['id', 'name'] }], transaction })
      return { quotation: publicQuotation(full ?? quotation, enquiry.ref), unpriced: draft.unpriced, excludedLabour: q.excludedLabour }
    })
    setResponseStatus(event, 201)
    return saved
  }
  catch (error) {
    // A rolled-back revision leaves no file behind.
    if (stored) await removeStored([storageKey])
    throw error
  }
})
