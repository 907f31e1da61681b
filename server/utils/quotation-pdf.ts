import { formatCents } from '../../shared/calc/quote'
import type { QuoteResult } from '../../shared/calc/quote'
import { scopeLabels } from '../../shared/workbench/quotation'

export const QUOTATION_DEMO_NOTICE = 'Demo prices — invented. Every price in this quotation comes from the demonstration price book and is invented; it is not an offer of any real product.'

export interface QuotationPdfInput {
  enquiryRef: string
  subject: string
  requester: string
  organisation: string | null
  revision: string
  validUntil: string
  officer: string
  issuedOn: string
  quote: QuoteResult
  unpriced: string[]
  notes: string[]
}

const euro = (cents: number) => `€ ${formatCents(cents)}`
const qty = (n: number) => (Number.isInteger(n) ? String(n) : n.toFixed(3).replace(/0+$/, '').replace(/\.$/, ''))

/**
 * The quotation as a PDF: title block, one row per priced line (quantity, unit price, amount), the totals with
 * discount, delivery and VAT, the validity date and the notice that the prices are invented.
 */
export async function renderQuotationPdf(input: QuotationPdfInput): Promise<Buffer> {
  const pdf = await createPdf({
    title: `Quotation ${input.enquiryRef} revision ${input.revision}`,
    subject: `Quotation for ${input.subject}`,
    runningHead: `Corrstone Building Systems Ltd — quotation ${input.enquiryRef}-${input.revision}`,
    runningHeadRight: 'Demo prices: invented',
    footNote: `${input.enquiryRef} quotation revision ${input.revision}, issued ${input.issuedOn}, valid until ${input.validUntil}.`,
  })
  drawQuotation(pdf, input)
  return pdf.finish()
}

/** The quotation's pages on a PDF being written: its own document, or a section of a response pack. */
export function drawQuotation(pdf: PdfWriter, input: QuotationPdfInput) {
  const q = input.quote
  const doc = pdf.doc
  pdf.heading(`Quotation ${input.enquiryRef}-${input.revision}`, 1)
  pdf.keyValues([
    ['Enquiry', `${input.enquiryRef} — ${input.subject}`],
    ['For', input.organisation ? `${input.requester}, ${input.organisation}` : input.requester],
    ['Scope', scopeLabels[q.scope]],
    ['Revision', input.revision],
    ['Issued', input.issuedOn],
    ['Valid until', input.validUntil],
    ['Prepared by', input.officer],
  ], { labelWidth: 110 })
  pdf.caution(QUOTATION_DEMO_NOTICE, 'Demo prices — invented')

  pdf.heading('Lines')
  const cols = { desc: pdf.left, qty: pdf.left + 265, unit: pdf.left + 320, price: pdf.left + 355, amount: pdf.left + 420 }
  const widths = { desc: 258, qty: 50, unit: 32, price: 60, amount: pdf.contentWidth - 420 }
  const row = (cells: [string, string, string, string, string], bold = false) => {
    const h = pdf.measure(cells[0], { width: widths.desc, size: 9, bold }) + 6
    pdf.ensureSpace(h)
    const y = doc.y
    const put = (text: string, x: number, width: number, align: 'left' | 'right') => {
      doc.y = y + 3
      pdf.text(text, { size: 9, bold, width, align }, x)
    }
    put(cells[0], cols.desc, widths.desc, 'left')
    put(cells[1], cols.qty, widths.qty, 'right')
    put(cells[2], cols.unit + 4, widths.unit, 'left')
    put(cells[3], cols.price, widths.price, 'right')
    put(cells[4], cols.amount, widths.amount, 'right')
    doc.y = y + h
    doc.save().moveTo(pdf.left, doc.y).lineTo(pdf.left + pdf.contentWidth, doc.y).lineWidth(0.5).strokeColor(pdfColours.rule).stroke().restore()
  }
  row(['Description', 'Qty', 'Unit', 'Unit price', 'Amount'], true)
  for (const l of q.lines) {
    const packs = l.packs !== null && l.packSize !== null ? ` — ${l.packs} × ${qty(l.packSize)} ${l.unit}` : ''
    row([`${l.description}${packs}`, qty(l.chargedQuantity), l.unit, formatCents(l.unitPrice), formatCents(l.amount)])
  }
  doc.y += 6

  pdf.heading('Totals')
  const totals: Array<[string, string]> = [
    ['Materials', euro(q.materials_cents)],
    ['Labour', euro(q.labour_cents)],
    ['Subtotal', euro(q.subtotal_cents)],
    [`Discount ${q.discountPercent} %`, `− ${euro(q.discount_cents)}`],
    ['Delivery', euro(q.delivery_cents)],
    ['Net', euro(q.net_cents)],
    [`VAT ${q.vatRatePercent} %`, euro(q.vat_cents)],
    ['Total', euro(q.total_cents)],
  ]
  pdf.keyValues(totals, { labelWidth: 200 })
  pdf.paragraph(`Total ${euro(q.total_cents)} including VAT at ${q.vatRatePercent} %. Valid until ${input.validUntil}.`, { bold: true })

  if (input.unpriced.length || q.excludedLabour.length || input.notes.length) {
    pdf.heading('Notes')
    for (const u of input.unpriced) pdf.listItem(`Not priced (no active price-book entry): ${u}.`)
    for (const code of q.excludedLabour) pdf.listItem(`Labour ${code} is outside the chosen scope and not included.`)
    for (const n of input.notes) pdf.listItem(n)
  }
  doc.y += 6
  pdf.caution('Quantities are estimated from the wall area and common-practice consumption rates; the contractor checks them against the drawings before ordering. Anchor numbers are for pricing only: a chartered engineer confirms the anchor design for the site.', 'Quantities')
}
