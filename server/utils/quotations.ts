import type { Transaction } from 'sequelize'
import { wallQuantities } from '../../shared/calc/quantities'
import type { PricedLine, QuoteResult, QuoteScope } from '../../shared/calc/quote'
import type { CreateQuotationInput, PriceBookRow } from '../../shared/workbench/quotation'
import { PriceItem, Quotation } from '../models'
import type { Enquiry, User } from '../models'
import type { QuotationPdfInput } from './quotation-pdf'

/** Revision letters in order; a quotation past Z is a new enquiry's business. */
export const QUOTATION_REVISIONS = 'ABCDEFGHIJKLMNOPQRSTUVWXYZ'

export function priceBookRow(item: PriceItem): PriceBookRow {
  return {
    code: item.code,
    description: item.description,
    unit: item.unit,
    unitPriceCents: item.unitPriceCents,
    packSize: item.packSize,
    kind: item.kind,
    active: item.active,
    demo: item.demo,
  }
}

/** The whole price book, in a stable order (kind, then code). */
export async function loadPriceBook(transaction?: Transaction): Promise<PriceBookRow[]> {
  useDb()
  const items = await PriceItem.findAll({ order: [['kind', 'ASC'], ['code', 'ASC']], transaction })
  return items.map(priceBookRow)
}

/** The letter after the enquiry's last revision (A for the first), under the caller's transaction lock. */
export async function nextQuotationRevision(enquiryId: number, transaction: Transaction): Promise<string> {
  const last = await Quotation.findOne({ where: { enquiryId }, order: [['revision', 'DESC']], transaction, lock: transaction.LOCK.UPDATE })
  if (!last) return 'A'
  const i = QUOTATION_REVISIONS.indexOf(last.revision)
  if (i < 0 || i + 1 >= QUOTATION_REVISIONS.length) {
    throw createError({ statusCode: 409, statusMessage: 'No revisions left', message: `This enquiry already has quotation revision ${last.revision}, the last letter.` })
  }
  return QUOTATION_REVISIONS[i + 1]!
}

/** A quotation as the API returns it, with the link to its PDF. */
export function publicQuotation(q: Quotation & { author?: User | null }, enquiryRef: string) {
  return {
    id: q.id,
    enquiryRef,
    revision: q.revision,
    scope: q.scope,
    lines: JSON.parse(q.lines) as PricedLine[],
    discountPercent: q.discountPercent,
    vatPercent: q.vatPercent,
    validUntil: q.validUntil,
    subtotalCents: q.subtotalCents,
    discountCents: q.discountCents,
    deliveryCents: q.deliveryCents,
    vatCents: q.vatCents,
    totalCents: q.totalCents,
    createdAt: q.createdAt,
    createdBy: { id: q.createdBy as number, name: q.author?.name ?? null },
    attachmentId: q.attachmentId,
    pdfUrl: q.attachmentId ? `/api/enquiries/${enquiryRef}/attachments/${q.attachmentId}` : null,
  }
}

/**
 * A saved quotation as its PDF shows it, rebuilt from what was saved (lines and totals as priced then; the
 * take-off notes re-derived from the saved quantities), so a response pack carries exactly the offer saved.
 */
export function savedQuotationPdfInput(q: Quotation, enquiry: Enquiry, names: { organisation: string | null, officer: string }): QuotationPdfInput {
  const lines = JSON.parse(q.lines) as PricedLine[]
  const inputs = JSON.parse(q.inputs) as CreateQuotationInput
  const quantities = wallQuantities(inputs.quantities)
  const sum = (kind: PricedLine['kind']) => lines.filter(l => l.kind === kind).reduce((total, l) => total + l.amount, 0)
  const quote: QuoteResult = {
    scope: q.scope as QuoteScope,
    lines,
    excludedLabour: [],
    materials_cents: sum('material'),
    labour_cents: sum('labour'),
    subtotal_cents: q.subtotalCents,
    discountPercent: q.discountPercent,
    discount_cents: q.discountCents,
    delivery_cents: q.deliveryCents,
    net_cents: q.subtotalCents - q.discountCents + q.deliveryCents,
    vatRatePercent: q.vatPercent,
    vat_cents: q.vatCents,
    total_cents: q.totalCents,
  }
  const charged = new Set(lines.map(l => l.code))
  return {
    enquiryRef: enquiry.ref,
    subject: enquiry.subject,
    requester: enquiry.requesterName,
    organisation: names.organisation ?? enquiry.requesterOrganisation,
    revision: q.revision,
    validUntil: q.validUntil,
    officer: names.officer,
    issuedOn: q.createdAt.toISOString().slice(0, 10),
    quote,
    unpriced: quantities.lines.filter(l => l.gross > 0 && !charged.has(l.item)).map(l => l.label),
    notes: quantities.notes,
  }
}
