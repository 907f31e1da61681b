/**
 * A quotation from a wall's quantities: the take-off of wallQuantities priced with priceQuote from the price book.
 * The browser runs it for the preview and the server runs it again before saving, so both agree to the cent.
 */
import { z } from 'zod'
import { CalcInputError } from '../calc/errors'
import { priceQuote } from '../calc/quote'
import type { LabourRate, PriceBookItem, QuoteInput, QuoteResult, QuoteScope } from '../calc/quote'
import { wallQuantities } from '../calc/quantities'
import type { WallQuantitiesResult } from '../calc/quantities'
import { quoteInput, wallQuantitiesInput } from '../calc/schemas2'

export const priceItemKinds = ['material', 'labour-lay', 'labour-system', 'delivery'] as const
export type PriceItemKind = (typeof priceItemKinds)[number]

/** A price-book row as the API returns it; money in integer cents. */
export interface PriceBookRow {
  code: string
  description: string
  unit: string
  unitPriceCents: number
  packSize: number | null
  kind: PriceItemKind
  active: boolean
  demo: boolean
}

export const scopeLabels: Record<QuoteScope, string> = {
  'supply': 'Supply only',
  'supply-and-lay': 'Supply and lay the masonry',
  'full-system': 'Full system: masonry and ETICS installed',
}

const isoDate = z.string({ error: 'Valid until must be a date' }).regex(/^\d{4}-\d{2}-\d{2}$/, 'Valid until must be a date (YYYY-MM-DD)')
  .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)), 'Valid until is not a real date')

/** Body of POST /api/enquiries/[ref]/quotations. */
export const createQuotationSchema = z.object({
  scope: quoteInput.shape.scope,
  quantities: wallQuantitiesInput,
  discountPercent: quoteInput.shape.discountPercent,
  vatPercent: quoteInput.shape.vatRatePercent,
  validUntil: isoDate,
  /** Price-book code of the delivery zone; no delivery line when absent. */
  deliveryCode: z.string().trim().min(1).max(60).optional(),
})
export type CreateQuotationInput = z.infer<typeof createQuotationSchema>

/** Body of PUT /api/price-book/[code]: what a manager may change. */
export const updatePriceItemSchema = z.object({
  description: z.string({ error: 'Description must be text' }).trim().min(1, 'Description is required').max(200).optional(),
  unitPriceCents: z.number({ error: 'Unit price must be a number' }).int('Unit price must be whole cents').min(0, 'Unit price cannot be negative').max(100_000_000, 'Unit price is not plausible'),
  packSize: z.number({ error: 'Pack size must be a number' }).gt(0, 'Pack size must be greater than zero').max(1e6).nullable().optional(),
  active: z.boolean({ error: 'Active must be true or false' }).optional(),
})
export type UpdatePriceItemInput = z.infer<typeof updatePriceItemSchema>

export interface QuotationDraft {
  quantities: WallQuantitiesResult
  quote: QuoteResult
  /** Quantity lines with no active price: left off the quotation and listed so nobody misses them. */
  unpriced: string[]
}

/**
 * Material lines are priced by the price-book code equal to the quantity item (e.g. `blocks`); labour by the net
 * wall area at the 'labour-lay' and 'labour-system' rates; delivery by the chosen zone.
 */
export function buildQuotation(input: CreateQuotationInput, book: PriceBookRow[]): QuotationDraft {
  const quantities = wallQuantities(input.quantities)
  const active = book.filter((r) => r.active)
  const materials: PriceBookItem[] = active
    .filter((r) => r.kind === 'material')
    .map((r) => ({ code: r.code, description: r.description, unit: r.unit, unitPrice: r.unitPriceCents, ...(r.packSize === null ? {} : { packSize: r.packSize }) }))
  const labourRates: LabourRate[] = active
    .filter((r) => r.kind === 'labour-lay' || r.kind === 'labour-system')
    .map((r) => ({ code: r.code, description: r.description, unit: r.unit, unitPrice: r.unitPriceCents, appliesTo: r.kind === 'labour-lay' ? 'lay' as const : 'system' as const }))
  const priced = new Set(materials.map((m) => m.code))
  const unpriced = quantities.lines.filter((l) => l.gross > 0 && !priced.has(l.item)).map((l) => l.label)
  let deliveryCharge: number | undefined
  if (input.deliveryCode !== undefined) {
    const zone = active.find((r) => r.kind === 'delivery' && r.code === input.deliveryCode)
    if (!zone) throw new CalcInputError('deliveryCode', `No active delivery zone with code ${input.deliveryCode}`)
    deliveryCharge = zone.unitPriceCents
  }
  const quoteIn: QuoteInput = {
    scope: input.scope,
    lines: quantities.lines
      .filter((l) => priced.has(l.item))
      .map((l) => ({ code: l.item, quantity: l.gross, unit: l.unit })),
    priceBook: materials,
    labourRates,
    labour: labourRates
      .filter((r) => r.unit === 'm²')
      .map((r) => ({ code: r.code, quantity: Math.round(quantities.netArea_m2 * 100) / 100 })),
    deliveryCharge,
    discountPercent: input.discountPercent,
    vatRatePercent: input.vatPercent,
  }
  return { quantities, quote: priceQuote(quoteIn), unpriced }
}
