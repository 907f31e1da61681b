import { createHash, randomUUID } from 'node:crypto'
import type { H3Event } from 'h3'
import { Op } from 'sequelize'
import type { Transaction } from 'sequelize'
import { packCautionKinds, packCautionTexts, packNeedsCheck } from '../../shared/schemas/pack'
import type { CautionKind, PackInput } from '../../shared/schemas/pack'
import { libraryCollectionLabels } from '../../shared/library/terms'
import { formatCents } from '../../shared/calc/quote'
import type { QuoteScope } from '../../shared/calc/quote'
import { scopeLabels } from '../../shared/workbench/quotation'
import { Attachment, Calculation, EnquiryEvent, EnquiryMessage, Organisation, Project, Quotation, User } from '../models'
import type { Enquiry, ResponsePack } from '../models'
import type { PinnedItem } from '../models/response-pack'
import type { Caller } from './access'

/**
 * Response packs: checking what an officer put in one, rendering it to a PDF with the shared PDF engine, and
 * issuing it — PDF stored as an attachment, reply written to the thread, enquiry answered, mail queued with
 * the PDF — all in the caller's transaction, so a failure leaves no half-issued pack behind.
 */

const DEPARTMENT = 'Corrstone Building Systems Ltd — Technical department'
const invalid = (message: string) => createError({ statusCode: 400, statusMessage: 'Invalid input', message })

export interface ResolvedPack {
  items: PinnedItem[]
  calculations: Calculation[]
  quotations: Quotation[]
  cautions: CautionKind[]
  checkerId: number | null
  needsCheck: boolean
}

/**
 * Checks a composed pack against the enquiry: every library item exists, every calculation is saved to this
 * enquiry, a nominated checker is active staff other than the author. Writes nothing.
 */
export async function resolvePackInput(event: H3Event, enquiry: Enquiry, caller: Caller, input: PackInput, transaction?: Transaction): Promise<ResolvedPack> {
  const items: PinnedItem[] = []
  const tagged: Array<{ code: string, tags: string[] }> = []
  for (const [i, code] of input.items.entries()) {
    const item = await getLibraryItem(event, code)
    if (!item) throw invalid(`items.${i}: There is no library item ${code}.`)
    items.push({ code: item.code, revision: item.revision, revisionDate: item.revisionDate, title: item.title, collection: item.collection })
    tagged.push({ code: item.code, tags: [...item.tags, item.title] })
  }
  const found = input.calculationIds.length
    ? await Calculation.findAll({ where: { id: { [Op.in]: input.calculationIds }, enquiryId: enquiry.id }, transaction })
    : []
  const calculations = input.calculationIds.map((id, i) => {
    const calc = found.find(c => c.id === id)
    // Another enquiry's calculation reads the same as one that does not exist.
    if (!calc) throw invalid(`calculationIds.${i}: Calculation ${id} is not saved to ${enquiry.ref}.`)
    return calc
  })
  const foundQuotations = input.quotationIds.length
    ? await Quotation.findAll({ where: { id: { [Op.in]: input.quotationIds }, enquiryId: enquiry.id }, transaction })
    : []
  const quotations = input.quotationIds.map((id, i) => {
    const quotation = foundQuotations.find(q => q.id === id)
    if (!quotation) throw invalid(`quotationIds.${i}: Quotation ${id} is not saved to ${enquiry.ref}.`)
    return quotation
  })
  let checkerId: number | null = null
  if (input.checkerId) {
    if (input.checkerId === caller.id) throw invalid('checkerId: The check is made by a second officer, not by the author.')
    const checker = await User.findByPk(input.checkerId, { transaction })
    if (!checker || checker.deactivatedAt || !['officer', 'manager', 'admin'].includes(checker.role)) {
      throw invalid('checkerId: The checker must be active department staff.')
    }
    checkerId = checker.id
  }
  return {
    items,
    calculations,
    quotations,
    cautions: packCautionKinds({ topic: enquiry.topic, calculationMethods: calculations.map(c => c.method), items: tagged }),
    checkerId,
    needsCheck: packNeedsCheck(enquiry.topic),
  }
}

const longDate = new Intl.DateTimeFormat('en-IE', { dateStyle: 'long', timeZone: 'Europe/Dublin' })

/** A value of a calculation's inputs or outputs as a reader reads it: numbers to four significant figures. */
function show(value: unknown): string {
  if (value === null || value === undefined) return '—'
  if (typeof value === 'number') return Number.isInteger(value) ? String(value) : String(Number(value.toPrecision(4)))
  if (typeof value === 'boolean') return value ? 'yes' : 'no'
  if (typeof value === 'string') return value
  if (Array.isArray(value)) return value.map(show).join('; ')
  return Object.entries(value as Record<string, unknown>).map(([k, v]) => `${k} ${show(v)}`).join(', ')
}

/** Rows of a key-value table from a JSON object: a list of objects gives one row per entry (layer 1, layer 2 …). */
function rowsOf(value: unknown, skip: string[] = []): Array<[string, string]> {
  if (value === null || typeof value !== 'object' || Array.isArray(value)) return [['Value', show(value)]]
  const rows: Array<[string, string]> = []
  for (const [key, v] of Object.entries(value as Record<string, unknown>)) {
    if (skip.includes(key)) continue
    if (Array.isArray(v) && v.some(x => x !== null && typeof x === 'object')) {
      if (!v.length) rows.push([key, 'none'])
      v.forEach((entry, i) => rows.push([`${key} ${i + 1}`, show(entry)]))
    }
    else rows.push([key, show(v)])
  }
  return rows
}

/** Markdown as the officer wrote it, set as headings, list items and paragraphs (emphasis marks dropped). */
function writeMarkdown(pdf: PdfWriter, source: string) {
  const plain = (s: string) => s.replace(/\*\*|__|`/g, '').replace(/(^|\s)[*_]([^*_]+)[*_](?=\s|$|[.,;:!?])/g, '$1$2').replace(/\[([^\]]+)\]\(([^)]+)\)/g, '$1 ($2)')
  let paragraph: string[] = []
  const flush = () => {
    if (paragraph.length) pdf.paragraph(plain(paragraph.join(' ')), { size: 10.5 })
    paragraph = []
  }
  for (const raw of source.split(/\r?\n/)) {
    const line = raw.trim()
    const heading = /^(#{1,3})\s+(.*)$/.exec(line)
    const bullet = /^[-*+]\s+(.*)$/.exec(line)
    const numbered = /^(\d+)[.)]\s+(.*)$/.exec(line)
    if (!line) flush()
    else if (heading) { flush(); pdf.heading(plain(heading[2]!), 3) }
    else if (bullet) { flush(); pdf.listItem(plain(bullet[1]!), '•', { size: 10.5 }) }
    else if (numbered) { flush(); pdf.listItem(plain(numbered[2]!), `${numbered[1]}.`, { size: 10.5 }) }
    else paragraph.push(line)
  }
  flush()
}

export interface PackDocument {
  enquiry: Enquiry
  revision: string
  replyBody: string
  issuedAt: Date
  officerName: string
  checkerName: string | null
  items: PinnedItem[]
  calculations: Calculation[]
  quotations: Quotation[]
  cautions: CautionKind[]
}

/** The pack as a PDF: cover letter, reply, one report page per calculation, the library sheets, the cautions. */
export async function renderPackPdf(event: H3Event, pack: PackDocument, transaction?: Transaction): Promise<Buffer> {
  const { enquiry, revision } = pack
  const project = enquiry.projectId ? await Project.findByPk(enquiry.projectId, { transaction }) : null
  const authors = await User.findAll({ where: { id: [...new Set(pack.calculations.map(c => c.createdBy))] }, attributes: ['id', 'name'], transaction })
  const date = longDate.format(pack.issuedAt)
  const pdf = await createPdf({
    title: `${enquiry.ref} response, revision ${revision}`,
    subject: `Response to technical enquiry ${enquiry.ref}: ${enquiry.subject}`,
    runningHead: DEPARTMENT,
    runningHeadRight: `${enquiry.ref} · Revision ${revision}`,
    footNote: `${enquiry.ref} response pack · Revision ${revision} · issued ${pack.issuedAt.toISOString().slice(0, 10)} · demo data: invented`,
  })

  // Cover letter.
  pdf.text(DEPARTMENT, { size: 10, bold: true, color: pdfColours.clay, gap: 4 })
  pdf.heading(`Response to technical enquiry ${enquiry.ref}`, 1)
  pdf.paragraph(enquiry.subject, { size: 12, color: pdfColours.muted, gap: 10 })
  const requester = [enquiry.requesterName, enquiry.requesterOrganisation, enquiry.requesterEmail].filter(Boolean).join(', ')
  const projectText = project ? [project.name, project.siteAddress, project.region].filter(Boolean).join(', ') : 'Not given'
  pdf.keyValues([
    ['Reference', enquiry.ref],
    ['Revision', revision],
    ['Date', date],
    ['Project', projectText],
    ['Requester', requester],
    ['Answered by', pack.officerName],
    ['Checked by', pack.checkerName ?? 'No second check was required for this topic'],
  ], { labelWidth: 110 })
  pdf.paragraph(`Dear ${enquiry.requesterName},`, { size: 10.5 })
  pdf.paragraph(`Thank you for your enquiry "${enquiry.subject}". Our reply follows, with the material listed below. `
    + 'Please quote the reference above in any correspondence about it.', { size: 10.5 })
  pdf.heading('In this pack', 3)
  pdf.listItem('Our reply')
  pack.calculations.forEach((c, i) => pdf.listItem(`Calculation ${i + 1}: ${calcMethods[c.method as CalcMethod]?.label ?? c.method}`))
  for (const item of pack.items) pdf.listItem(`${item.code} rev ${item.revision}: ${item.title} (${libraryCollectionLabels[item.collection as keyof typeof libraryCollectionLabels] ?? item.collection})`)
  for (const q of pack.quotations) pdf.listItem(`Quotation ${enquiry.ref}-${q.revision}: ${scopeLabels[q.scope as QuoteScope] ?? q.scope}, total € ${formatCents(q.totalCents)} including VAT, valid until ${q.validUntil}`)
  pdf.listItem('Cautions that apply to this answer')
  pdf.doc.y += 6
  for (const line of ['Yours sincerely,', pack.officerName, DEPARTMENT]) pdf.text(line, { size: 10.5 })

  pdf.doc.addPage()
  pdf.heading('Our reply', 1)
  writeMarkdown(pdf, pack.replyBody)

  for (const [i, calc] of pack.calculations.entries()) {
    pdf.doc.addPage()
    const label = calcMethods[calc.method as CalcMethod]?.label ?? calc.method
    const outputs = JSON.parse(calc.outputs) as Record<string, unknown>
    pdf.heading(`Calculation ${i + 1}: ${label}`, 1)
    pdf.keyValues([
      ['Method', `${label} (${calc.method})`],
      ['Saved by', `${authors.find(a => a.id === calc.createdBy)?.name ?? 'Department staff'}, ${longDate.format(calc.createdAt)}`],
      ['Engine version', calc.engineVersion],
      ['Calculation number', String(calc.id)],
    ], { labelWidth: 130 })
    pdf.heading('Inputs')
    pdf.keyValues(rowsOf(JSON.parse(calc.inputs)), { labelWidth: 130 })
    const standard = Array.isArray(outputs.standard) ? outputs.standard.map(String) : []
    pdf.heading('Method and standard')
    if (standard.length) for (const clause of standard) pdf.listItem(clause)
    else pdf.paragraph(label)
    pdf.heading('Results')
    pdf.keyValues(rowsOf(outputs, ['caution', 'standard', 'notes', 'paths']), { labelWidth: 130 })
    if (Array.isArray(outputs.notes) && outputs.notes.length) {
      pdf.heading('Notes', 3)
      for (const note of outputs.notes) pdf.listItem(String(note))
    }
    pdf.caution(typeof outputs.caution === 'string' ? outputs.caution : packCautionTexts.general.text)
  }

  for (const pinned of pack.items) {
    const item = await getLibraryItem(event, pinned.code)
    if (!item) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `Library item ${pinned.code} is no longer in the library.` })
    if (item.revision !== pinned.revision) {
      throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `${pinned.code} was revised (now revision ${item.revision}) after the pack was composed; compose the pack again.` })
    }
    pdf.doc.addPage()
    await drawLibrarySheet(event, pdf, item)
  }

  if (pack.quotations.length) {
    const organisation = enquiry.organisationId ? await Organisation.findByPk(enquiry.organisationId, { attributes: ['name'], transaction }) : null
    const quoters = await User.findAll({ where: { id: [...new Set(pack.quotations.map(q => q.createdBy))] }, attributes: ['id', 'name'], transaction })
    for (const q of pack.quotations) {
      pdf.doc.addPage()
      drawQuotation(pdf, savedQuotationPdfInput(q, enquiry, {
        organisation: organisation?.name ?? null,
        officer: quoters.find(u => u.id === q.createdBy)?.name ?? 'Department staff',
      }))
    }
  }

  pdf.doc.addPage()
  pdf.heading('Cautions', 1)
  pdf.paragraph('These cautions apply to everything in this pack. Please pass them on with it.', { color: pdfColours.muted, gap: 8 })
  for (const kind of pack.cautions) pdf.caution(packCautionTexts[kind].text, packCautionTexts[kind].title)
  return pdf.finish()
}

/** The pack's JSON columns, parsed. */
export function packContents(pack: ResponsePack) {
  return {
    items: JSON.parse(pack.items) as PinnedItem[],
    calculationIds: JSON.parse(pack.calculationIds) as number[],
    quotationIds: JSON.parse(pack.quotationIds ?? '[]') as number[],
    cautions: JSON.parse(pack.cautions) as CautionKind[],
  }
}

const answerableFrom = ['in_hand', 'reopened', 'waiting_on_requester']

/**
 * Issues a pack inside the caller's transaction (the enquiry row already locked): renders and stores the
 * PDF, writes the reply, answers the enquiry, queues the mail with the PDF. Returns the stored key, which the
 * caller removes from the store again should the transaction fail.
 */
export async function issuePack(event: H3Event, pack: ResponsePack, enquiry: Enquiry, checkerId: number | null, transaction: Transaction, stored: string[]): Promise<Attachment> {
  const contents = packContents(pack)
  const officer = await User.findByPk(pack.officerId, { transaction })
  const checker = checkerId ? await User.findByPk(checkerId, { transaction }) : null
  const calculations = contents.calculationIds.length
    ? await Calculation.findAll({ where: { id: contents.calculationIds, enquiryId: enquiry.id }, transaction })
    : []
  const ordered = contents.calculationIds.map(id => calculations.find(c => c.id === id)).filter((c): c is Calculation => !!c)
  const quotations = contents.quotationIds.length
    ? await Quotation.findAll({ where: { id: contents.quotationIds, enquiryId: enquiry.id }, transaction })
    : []
  const orderedQuotations = contents.quotationIds.map(id => quotations.find(q => q.id === id)).filter((q): q is Quotation => !!q)
  const now = new Date()
  const bytes = await renderPackPdf(event, {
    enquiry, revision: pack.revision, replyBody: pack.replyBody, issuedAt: now,
    officerName: officer?.name ?? 'Department staff', checkerName: checker?.name ?? null,
    items: contents.items, calculations: ordered, quotations: orderedQuotations, cautions: contents.cautions,
  }, transaction)

  const officerName = officer?.name ?? 'Department staff'
  const message = await EnquiryMessage.create({
    enquiryId: enquiry.id, kind: 'reply', authorUserId: pack.officerId, authorName: officerName, body: pack.replyBody, source: 'web', createdAt: now,
  }, { transaction })
  const storageKey = `packs:${randomUUID()}`
  const attachment = await Attachment.create({
    enquiryId: enquiry.id, messageId: message.id, storageKey, fileName: `${enquiry.ref}-response-rev-${pack.revision}.pdf`, fileType: 'pdf',
    contentType: 'application/pdf', sizeBytes: bytes.length, sha256: createHash('sha256').update(bytes).digest('hex'), internal: false, uploadedBy: pack.officerId,
  }, { transaction })
  pack.status = 'issued'
  pack.messageId = message.id
  pack.attachmentId = attachment.id
  pack.checkerId = checker?.id ?? null
  pack.issuedAt = now
  await pack.save({ transaction })

  enquiry.firstResponseAt ??= now
  if (answerableFrom.includes(enquiry.status)) {
    await EnquiryEvent.create({ enquiryId: enquiry.id, actorUserId: checker?.id ?? pack.officerId, kind: 'status', fromValue: enquiry.status, toValue: 'answered', createdAt: now }, { transaction })
    enquiry.status = 'answered'
    enquiry.answeredAt = now
  }
  enquiry.lastActivityAt = now

  const mail = replyMail({
    ref: enquiry.ref, subject: enquiry.subject, name: enquiry.requesterName, officer: officerName,
    body: `${pack.replyBody}\n\nOur response pack ${attachment.fileName} (revision ${pack.revision}) is attached.`,
    url: `${useRuntimeConfig().siteUrl}/my-enquiries/${enquiry.ref}`,
  })
  await queueEnquiryMail(enquiry, 'reply', mail, transaction, [attachment.id])
  await refreshDueTimes(enquiry, transaction)
  await enquiry.save({ transaction })
  stored.push(storageKey)
  await useStorage('uploads').setItemRaw(storageKey, bytes)
  return attachment
}

/** A pack as its list shows it; the requester's side sees issued packs only, so no check details leak. */
export function publicPack(pack: ResponsePack & { officer?: User | null, checker?: User | null, attachment?: Attachment | null }, enquiryRef: string) {
  const contents = packContents(pack)
  return {
    id: pack.id,
    revision: pack.revision,
    status: pack.status,
    officer: pack.officer ? { id: pack.officer.id, name: pack.officer.name } : { id: pack.officerId, name: null },
    checker: pack.checker ? { id: pack.checker.id, name: pack.checker.name } : null,
    nominatedCheckerId: pack.status === 'issued' ? null : pack.checkerId,
    replyBody: pack.replyBody,
    items: contents.items,
    calculationIds: contents.calculationIds,
    quotationIds: contents.quotationIds,
    cautions: contents.cautions,
    createdAt: pack.createdAt,
    issuedAt: pack.issuedAt,
    attachment: pack.attachment
      ? { id: pack.attachment.id, fileName: pack.attachment.fileName, sizeBytes: pack.attachment.sizeBytes, sha256: pack.attachment.sha256, url: `/api/enquiries/${enquiryRef}/attachments/${pack.attachment.id}` }
      : null,
  }
}
