/**
 * Quotation arithmetic: quantity lines priced from a price book, labour by scope, delivery, discount and VAT.
 *
 * All money is integer cents (minor currency units) so that sums never drift; products of a quantity and a price
 * are computed exactly with BigInt and rounded half up to the cent once per line.
 */
import { CalcInputError, requireFinite, requireRange } from './errors'

export type QuoteScope = 'supply' | 'supply-and-lay' | 'full-system'

export interface PriceBookItem {
  code: string
  description: string
  /** Unit the price is for, e.g. 'nr', 'bag', 'm²'. */
  unit: string
  /** Price of one unit, integer cents. */
  unitPrice: number
  /** When set, the item is sold only in whole packs of this many units: the quantity is rounded up to full packs. */
  packSize?: number
}

export interface LabourRate {
  code: string
  description: string
  unit: string
  /** Price of one unit of labour, integer cents. */
  unitPrice: number
  /** 'lay' = laying the masonry (supply-and-lay and full-system); 'system' = installing the ETICS (full-system only). */
  appliesTo: 'lay' | 'system'
}

export interface QuoteQuantityLine {
  code: string
  quantity: number
  /** When given, it must match the price book unit, to catch bags priced as kilograms. */
  unit?: string
  /** Replaces the price-book description on the quotation. */
  description?: string
}

export interface QuoteInput {
  lines: QuoteQuantityLine[]
  priceBook: PriceBookItem[]
  labourRates?: LabourRate[]
  /** Labour quantities (e.g. m² of wall laid), priced from labourRates when the scope includes them. */
  labour?: QuoteQuantityLine[]
  /** Delivery charge for the chosen zone, integer cents; not discounted, VAT charged on it. */
  deliveryCharge?: number
  scope: QuoteScope
  /** Discount on materials and labour (%), to two decimals. */
  discountPercent?: number
  /** VAT rate (%), to two decimals, e.g. 23 or 13.5. */
  vatRatePercent: number
}

export interface PricedLine {
  kind: 'material' | 'labour' | 'delivery'
  code: string
  description: string
  unit: string
  /** Quantity asked for, rounded to 0.001. */
  quantity: number
  packSize: number | null
  packs: number | null
  /** Quantity charged: the quantity, or whole packs of it. */
  chargedQuantity: number
  unitPrice: number
  /** Line amount, integer cents. */
  amount: number
}

export interface QuoteResult {
  scope: QuoteScope
  lines: PricedLine[]
  /** Labour lines left out because the scope does not include them. */
  excludedLabour: string[]
  materials_cents: number
  labour_cents: number
  /** Materials + labour, before discount. */
  subtotal_cents: number
  discountPercent: number
  discount_cents: number
  delivery_cents: number
  /** Subtotal − discount + delivery: the amount VAT is charged on. */
  net_cents: number
  vatRatePercent: number
  vat_cents: number
  total_cents: number
}

// BigInt() rather than 2n-style literals: the browser build targets ES2019, which has no bigint literal syntax.
const TWO = BigInt(2)

/** Round n/d half up for n ≥ 0, d > 0, exactly. */
function divRoundHalfUp(n: bigint, d: bigint): bigint {
  return (TWO * n + d) / (TWO * d)
}

function requireCents(field: string, value: unknown): number {
  const n = requireFinite(field, value)
  if (!Number.isSafeInteger(n) || n < 0) {
    throw new CalcInputError(field, `${field} must be a whole, non-negative number of cents (got ${n})`)
  }
  return n
}

/** Percentages are held in hundredths of a percent (basis points) so rates such as 13.5 % stay exact. */
function percentToBasisPoints(field: string, value: number): number {
  const p = requireRange(field, value, 0, 100)
  return Math.round(p * 100)
}

/** Converts a decimal amount (e.g. 12.34) to integer cents, rounding half away from zero at the third decimal. */
export function decimalToCents(amount: number): number {
  const a = requireFinite('amount', amount)
  // toFixed works on the decimal expansion, so 1.005 gives 101 rather than 100.
  const cents = Math.round(Number((Math.abs(a) * 100).toFixed(6)))
  return a < 0 ? -cents : cents
}

/** Formats integer cents as a plain decimal string, e.g. 123456 → "1234.56", for documents and exports. */
export function formatCents(cents: number): string {
  const c = requireFinite('cents', cents)
  if (!Number.isSafeInteger(c)) throw new CalcInputError('cents', `cents must be a whole number (got ${c})`)
  const sign = c < 0 ? '-' : ''
  const abs = Math.abs(c)
  return `${sign}${Math.floor(abs / 100)}.${String(abs % 100).padStart(2, '0')}`
}

function priceLine(
  kind: 'material' | 'labour',
  field: string,
  line: QuoteQuantityLine,
  item: { code: string; description: string; unit: string; unitPrice: number; packSize?: number },
): PricedLine {
  const quantity = requireRange(`${field}.quantity`, line.quantity, 0, 1e9)
  if (line.unit !== undefined && line.unit !== item.unit) {
    throw new CalcInputError(`${field}.unit`, `${field} is in ${line.unit} but the price for ${item.code} is per ${item.unit}`)
  }
  const qtyMilli = Math.round(quantity * 1000)
  let packs: number | null = null
  let chargedMilli = qtyMilli
  let packSize: number | null = null
  if (item.packSize !== undefined) {
    packSize = item.packSize
    const packMilli = Math.round(packSize * 1000)
    packs = Math.ceil(qtyMilli / packMilli)
    chargedMilli = packs * packMilli
  }
  const amount = Number(divRoundHalfUp(BigInt(chargedMilli) * BigInt(item.unitPrice), BigInt(1000)))
  return {
    kind,
    code: item.code,
    description: line.description ?? item.description,
    unit: item.unit,
    quantity: qtyMilli / 1000,
    packSize,
    packs,
    chargedQuantity: chargedMilli / 1000,
    unitPrice: item.unitPrice,
    amount,
  }
}

function indexByCode<T extends { code: string; unitPrice: number; packSize?: number }>(field: string, items: T[]): Map<string, T> {
  const map = new Map<string, T>()
  items.forEach((it, i) => {
    if (typeof it.code !== 'string' || it.code.trim() === '') throw new CalcInputError(`${field}[${i}].code`, `${field}[${i}].code must not be empty`)
    if (map.has(it.code)) throw new CalcInputError(`${field}[${i}].code`, `${field} lists code ${it.code} twice`)
    requireCents(`${field}[${i}].unitPrice`, it.unitPrice)
    if (it.packSize !== undefined) {
      const p = requireRange(`${field}[${i}].packSize`, it.packSize, 0.001, 1e6)
      if (p <= 0) throw new CalcInputError(`${field}[${i}].packSize`, `${field}[${i}].packSize must be greater than zero`)
    }
    map.set(it.code, it)
  })
  return map
}

/**
 * Prices a quotation. Supply covers the material lines; supply-and-lay adds labour rated 'lay'; the full
 * system adds labour rated 'system' as well. Lines with zero quantity are left off. The discount applies to
 * materials and labour, not to delivery; VAT is charged on the discounted subtotal plus delivery. Each rounding
 * is half up to the cent: per line, then once for the discount and once for VAT.
 */
export function priceQuote(input: QuoteInput): QuoteResult {
  const scope = input.scope
  if (scope !== 'supply' && scope !== 'supply-and-lay' && scope !== 'full-system') {
    throw new CalcInputError('scope', `scope must be 'supply', 'supply-and-lay' or 'full-system' (got ${String(scope)})`)
  }
  if (!Array.isArray(input.lines)) throw new CalcInputError('lines', 'lines must be a list of quantity lines')
  if (!Array.isArray(input.priceBook)) throw new CalcInputError('priceBook', 'priceBook must be a list of priced items')
  const book = indexByCode('priceBook', input.priceBook)
  const rates = indexByCode('labourRates', input.labourRates ?? [])
  const discountBp = percentToBasisPoints('discountPercent', input.discountPercent ?? 0)
  const vatBp = percentToBasisPoints('vatRatePercent', input.vatRatePercent)
  const delivery = requireCents('deliveryCharge', input.deliveryCharge ?? 0)

  const lines: PricedLine[] = []
  input.lines.forEach((line, i) => {
    const item = book.get(line.code)
    if (!item) throw new CalcInputError(`lines[${i}].code`, `No price in the price book for code ${line.code}`)
    const priced = priceLine('material', `lines[${i}]`, line, item)
    if (priced.quantity > 0) lines.push(priced)
  })

  const allowed = new Set<LabourRate['appliesTo']>(scope === 'supply' ? [] : scope === 'supply-and-lay' ? ['lay'] : ['lay', 'system'])
  const excludedLabour: string[] = []
  ;(input.labour ?? []).forEach((line, i) => {
    const rate = rates.get(line.code)
    if (!rate) throw new CalcInputError(`labour[${i}].code`, `No labour rate for code ${line.code}`)
    if (rate.appliesTo !== 'lay' && rate.appliesTo !== 'system') {
      throw new CalcInputError(`labourRates.${rate.code}.appliesTo`, `appliesTo of labour rate ${rate.code} must be 'lay' or 'system'`)
    }
    if (!allowed.has(rate.appliesTo)) {
      excludedLabour.push(rate.code)
      return
    }
    const priced = priceLine('labour', `labour[${i}]`, line, rate)
    if (priced.quantity > 0) lines.push(priced)
  })

  if (delivery > 0) {
    lines.push({
      kind: 'delivery',
      code: 'delivery',
      description: 'Delivery',
      unit: 'load',
      quantity: 1,
      packSize: null,
      packs: null,
      chargedQuantity: 1,
      unitPrice: delivery,
      amount: delivery,
    })
  }

  const sum = (kind: PricedLine['kind']) => lines.filter((l) => l.kind === kind).reduce((s, l) => s + l.amount, 0)
  const materials = sum('material')
  const labour = sum('labour')
  const subtotal = materials + labour
  const discount = Number(divRoundHalfUp(BigInt(subtotal) * BigInt(discountBp), BigInt(10000)))
  const net = subtotal - discount + delivery
  const vat = Number(divRoundHalfUp(BigInt(net) * BigInt(vatBp), BigInt(10000)))
  return {
    scope,
    lines,
    excludedLabour,
    materials_cents: materials,
    labour_cents: labour,
    subtotal_cents: subtotal,
    discountPercent: discountBp / 100,
    discount_cents: discount,
    delivery_cents: delivery,
    net_cents: net,
    vatRatePercent: vatBp / 100,
    vat_cents: vat,
    total_cents: net + vat,
  }
}
