import { describe, expect, it } from 'vitest'
import { CalcInputError } from '../../../shared/calc/errors'
import { decimalToCents, formatCents, priceQuote, type QuoteInput, type QuoteScope } from '../../../shared/calc/quote'
import { quoteInput } from '../../../shared/calc/schemas2'

// Demo prices, invented for the test (integer cents).
const priceBook: QuoteInput['priceBook'] = [
  { code: 'BLK300', description: 'Lightweight block 440×215×300', unit: 'nr', unitPrice: 285 },
  { code: 'TLM25', description: 'Thin-layer mortar 25 kg', unit: 'bag', unitPrice: 1190 },
  { code: 'ANC', description: 'Insulation anchor', unit: 'nr', unitPrice: 42, packSize: 100 },
  { code: 'MESH', description: 'Reinforcing mesh', unit: 'm²', unitPrice: 165, packSize: 50 },
  { code: 'BEAD', description: 'Corner bead', unit: 'm', unitPrice: 45 },
]
const labourRates: QuoteInput['labourRates'] = [
  { code: 'LAY', description: 'Lay thin-joint blockwork', unit: 'm²', unitPrice: 2450, appliesTo: 'lay' },
  { code: 'ETX', description: 'Install insulation system', unit: 'm²', unitPrice: 4500, appliesTo: 'system' },
]
const base: QuoteInput = {
  lines: [
    { code: 'BLK300', quantity: 979, unit: 'nr' },
    { code: 'TLM25', quantity: 26, unit: 'bag' },
    { code: 'ANC', quantity: 567 },
    { code: 'MESH', quantity: 110 },
    { code: 'BEAD', quantity: 0 },
  ],
  priceBook,
  labourRates,
  labour: [
    { code: 'LAY', quantity: 90 },
    { code: 'ETX', quantity: 90 },
  ],
  deliveryCharge: 15000,
  scope: 'supply',
  discountPercent: 5,
  vatRatePercent: 23,
}

describe('priceQuote', () => {
  it('prices material lines, rounding packed items up to whole packs (derived by hand)', () => {
    const r = priceQuote(base)
    const amounts = Object.fromEntries(r.lines.map((l) => [l.code, l.amount]))
    // 979 × 285 = 279 015; 26 × 1190 = 30 940; 567 anchors → 6 packs = 600 × 42 = 25 200;
    // 110 m² mesh → 3 rolls = 150 m² × 165 = 24 750; the zero-quantity bead line is left off.
    expect(amounts).toEqual({ BLK300: 279015, TLM25: 30940, ANC: 25200, MESH: 24750, delivery: 15000 })
    const anchors = r.lines.find((l) => l.code === 'ANC')!
    expect(anchors.packs).toBe(6)
    expect(anchors.chargedQuantity).toBe(600)
    expect(r.materials_cents).toBe(359905)
  })

  // Derived by hand. Materials 359 905; labour LAY 90 × 2450 = 220 500, ETX 90 × 4500 = 405 000; delivery 15 000.
  // supply:         subtotal 359 905; 5 % = 17 995.25 → 17 995; net 356 910; 23 % = 82 089.30 → 82 089; total 438 999
  // supply-and-lay: subtotal 580 405; 5 % = 29 020.25 → 29 020; net 566 385; 23 % = 130 268.55 → 130 269; total 696 654
  // full-system:    subtotal 985 405; 5 % = 49 270.25 → 49 270; net 951 135; 23 % = 218 761.05 → 218 761; total 1 169 896
  it.each<[QuoteScope, number, number, number, number, number, number, string[]]>([
    ['supply', 0, 359905, 17995, 356910, 82089, 438999, ['LAY', 'ETX']],
    ['supply-and-lay', 220500, 580405, 29020, 566385, 130269, 696654, ['ETX']],
    ['full-system', 625500, 985405, 49270, 951135, 218761, 1169896, []],
  ])('scope %s', (scope, labour, subtotal, discount, net, vat, total, excluded) => {
    const r = priceQuote({ ...base, scope })
    expect(r.labour_cents).toBe(labour)
    expect(r.subtotal_cents).toBe(subtotal)
    expect(r.discount_cents).toBe(discount)
    expect(r.delivery_cents).toBe(15000)
    expect(r.net_cents).toBe(net)
    expect(r.vat_cents).toBe(vat)
    expect(r.total_cents).toBe(total)
    expect(r.excludedLabour).toEqual(excluded)
    // the parts add up exactly
    expect(r.lines.reduce((s, l) => s + l.amount, 0)).toBe(subtotal + 15000)
    expect(Number.isInteger(r.total_cents)).toBe(true)
  })

  it.each<[string, number, number, number]>([
    // derived by hand: 0.7 × 45 = 31.5 → 32 (a plain float product gives 31.4999… and would round to 31)
    ['float product just under a half cent', 0.7, 45, 32],
    // derived by hand: 0.58 × 25 = 14.5 → 15
    ['another half cent', 0.58, 25, 15],
    // derived by hand: 2.5 × 333 = 832.5 → 833
    ['half cent rounds up', 2.5, 333, 833],
    // derived by hand: 0.333 × 100 = 33.3 → 33
    ['below half rounds down', 0.333, 100, 33],
  ])('%s: %s × %s cents = %s cents', (_n, quantity, unitPrice, amount) => {
    const r = priceQuote({
      lines: [{ code: 'X', quantity }],
      priceBook: [{ code: 'X', description: 'Item', unit: 'm', unitPrice }],
      scope: 'supply',
      vatRatePercent: 0,
    })
    expect(r.lines[0]!.amount).toBe(amount)
    expect(r.total_cents).toBe(amount)
  })

  it.each<[number, number, number, number, number]>([
    // derived by hand: 999 × 12.5 % = 124.875 → 125; net 874; 13.5 % VAT = 117.99 → 118; total 992
    [12.5, 13.5, 125, 118, 992],
    // derived by hand: no discount; 23 % of 999 = 229.77 → 230; total 1229
    [0, 23, 0, 230, 1229],
    // derived by hand: 100 % discount leaves nothing to tax
    [100, 23, 999, 0, 0],
  ])('discount %s %% and VAT %s %% on 999 cents', (discountPercent, vatRatePercent, discount, vat, total) => {
    const r = priceQuote({
      lines: [{ code: 'X', quantity: 1 }],
      priceBook: [{ code: 'X', description: 'Item', unit: 'nr', unitPrice: 999 }],
      scope: 'supply',
      discountPercent,
      vatRatePercent,
    })
    expect(r.discount_cents).toBe(discount)
    expect(r.vat_cents).toBe(vat)
    expect(r.total_cents).toBe(total)
  })

  it('sums many small lines without drift', () => {
    // derived by hand: 1000 lines of 0.1 m at 10 cents = 1 cent each = 1000 cents
    const lines = Array.from({ length: 1000 }, () => ({ code: 'X', quantity: 0.1 }))
    const r = priceQuote({ lines, priceBook: [{ code: 'X', description: 'Item', unit: 'm', unitPrice: 10 }], scope: 'supply', vatRatePercent: 0 })
    expect(r.total_cents).toBe(1000)
  })

  it.each<[string, Partial<QuoteInput>, string]>([
    ['an unknown code', { lines: [{ code: 'NOPE', quantity: 1 }] }, 'lines[0].code'],
    ['a price in fractions of a cent', { priceBook: [{ code: 'BLK300', description: 'b', unit: 'nr', unitPrice: 12.5 }] }, 'priceBook[0].unitPrice'],
    ['a negative quantity', { lines: [{ code: 'BLK300', quantity: -1 }] }, 'lines[0].quantity'],
    ['a unit that does not match the price', { lines: [{ code: 'TLM25', quantity: 26, unit: 'kg' }] }, 'lines[0].unit'],
    ['VAT above 100 %', { vatRatePercent: 120 }, 'vatRatePercent'],
    ['a NaN discount', { discountPercent: Number.NaN }, 'discountPercent'],
    ['a code listed twice', { priceBook: [...priceBook, priceBook[0]!] }, `priceBook[${priceBook.length}].code`],
    ['an unknown scope', { scope: 'everything' as never }, 'scope'],
    ['a fractional delivery charge', { deliveryCharge: 10.5 }, 'deliveryCharge'],
    ['an unknown labour code', { labour: [{ code: 'PAINT', quantity: 1 }] }, 'labour[0].code'],
  ])('rejects %s', (_n, change, field) => {
    try {
      priceQuote({ ...base, ...change })
      expect.unreachable('should have thrown')
    } catch (e) {
      expect(e).toBeInstanceOf(CalcInputError)
      expect((e as CalcInputError).field).toBe(field)
    }
  })

  it('the schema accepts the worked quotation and rejects fractional cents', () => {
    expect(quoteInput.safeParse(base).success).toBe(true)
    expect(quoteInput.safeParse({ ...base, deliveryCharge: 10.5 }).success).toBe(false)
  })
})

describe('money helpers', () => {
  it.each<[number, string]>([
    [123456, '1234.56'],
    [5, '0.05'],
    [0, '0.00'],
    [-250, '-2.50'],
  ])('formatCents(%s) = %s', (cents, text) => {
    expect(formatCents(cents)).toBe(text)
  })

  it.each<[number, number]>([
    [19.99, 1999],
    [1.005, 101], // the float 1.005 is 1.00499…; the helper rounds the written decimal
    [0.1 + 0.2, 30],
    [-2.5, -250],
  ])('decimalToCents(%s) = %s', (amount, cents) => {
    expect(decimalToCents(amount)).toBe(cents)
  })

  it('rejects non-numbers', () => {
    expect(() => formatCents(1.5)).toThrow(CalcInputError)
    expect(() => decimalToCents(Number.POSITIVE_INFINITY)).toThrow(CalcInputError)
  })
})
