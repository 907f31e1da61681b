import { fetch } from '@nuxt/test-utils/e2e'
import { beforeAll, describe, expect, it } from 'vitest'
import { formatCents } from '../../shared/calc'
import { buildQuotation } from '../../shared/workbench/quotation'
import type { CreateQuotationInput, PriceBookRow } from '../../shared/workbench/quotation'
import { windAnchors } from '../../shared/workbench/wind-anchors'
import type { WindAnchorsInput } from '../../shared/workbench/wind-anchors'
import type { WallStrengthInput } from '../../shared/workbench/wall-strength'
import { call, currentYear, demo, signIn } from '../support/api'
import { useBuiltServer } from '../support/server'
import { pdfText } from '../support/pdf'

const year = currentYear()
const ref3 = `TQ-${year}-0003` // seeded: Quay Street apartments, wind topic, Keel Structural (specifier B)

/** Five storeys of 3 m, a 30 m facade on a 12 m deep building, terrain II, vb 26 m/s. */
const wind: WindAnchorsInput = {
  vb: 26, terrain: 'II', facadeLength_m: 30, depth_m: 12, storeys: 5, storeyHeight_m: 3,
  loadedArea_m2: 1, openingsPercent: 20, anchorResistance_kN: 0.15, gammaQ: 1.5, minimumPerM2: 6,
}
const strength: WallStrengthInput = {
  units: { meanStrength: 7.3, unitHeight_mm: 215, unitWidth_mm: 300, conditioning: 'air-dry' },
  mortar: { type: 'thin-layer' },
  annex: { presetId: 'en1996-recommended', unit: 'aggregate-concrete', group: 1, unitCategory: 'I', executionClass: '2', mortarSpec: 'designed' },
  wall: { method: 'annex-g', t_mm: 300, h_m: 2.7, rho: 0.75, topEccentricity_mm: 15, bottomEccentricity_mm: 0 },
}
const quantities = {
  area_m2: 600, openings_m2: 120, baseLength_m: 84, openingsCount: 40, openingsPerimeter_m: 220, openingHeads_m: 56,
  externalCorners_m: 60, system: { block: { length_mm: 440, height_mm: 215, thickness_mm: 300 } },
}
const programme = { area_m2: 480, storeys: 5, gangs: 2 }

async function download(path: string, cookie: string): Promise<Uint8Array> {
  const res = await fetch(path, { headers: { cookie } })
  expect(res.status, path).toBe(200)
  expect(res.headers.get('content-type')).toBe('application/pdf')
  return new Uint8Array(await res.arrayBuffer())
}

describe('workbench part 2 and quotation API', async () => {
  await useBuiltServer()
  let officer: string, manager: string, specA: string, specB: string
  beforeAll(async () => {
    ;[officer, manager, specA, specB] = await Promise.all([signIn(demo.officer), signIn(demo.manager), signIn(demo.specA), signIn(demo.specB)])
  })

  describe('calculation routes are for staff', () => {
    it.each(['wind', 'strength', 'quantities', 'programme'])('POST /api/calc/%s: 401 anonymous, 403 specifier, 400 with a named field for an officer', async (name) => {
      expect((await call(`/api/calc/${name}`, { body: {} })).status).toBe(401)
      expect((await call(`/api/calc/${name}`, { body: {}, cookie: specA })).status).toBe(403)
      const res = await call(`/api/calc/${name}`, { body: {}, cookie: officer })
      expect(res.status).toBe(400)
      expect(res.body.message).toMatch(/^[\w.]+: .+/)
      expect(res.body.message).not.toMatch(/NaN|undefined/)
    })
  })

  describe('wind and anchors', () => {
    it('answers qp and the zone counts of a worked five-storey case', async () => {
      const res = await call('/api/calc/wind', { body: wind, cookie: officer })
      expect(res.status).toBe(200)
      // Hand-derived, EN 1991-1-4 §4.3–4.5, terrain II (z0 = 0.05 m, Table 4.1), ze = h = 15 m:
      // kr = 0.19, ln(15/0.05) = 5.7038, cr = 1.0837, vm = 28.18 m/s, Iv = 1/5.7038 = 0.1753,
      // qp = (1 + 7·0.1753)·½·1.25·28.18² = 1105 Pa.
      expect(res.body.pressure.qp).toBeCloseTo(1105.2, 0)
      expect(res.body.pressure.Iv).toBeCloseTo(0.1753, 4)
      // EN 1991-1-4 Figure 7.5: e = min(b = 12, 2h = 30) = 12 m < d = 30 m, so A = e/5 = 2.4 m, B = 9.6 m, C = 18 m.
      expect(res.body.along.e).toBe(12)
      const byZone = Object.fromEntries(res.body.layout.zones.map((z: { zone: string }) => [z.zone, z]))
      // Table 7.1, loaded area 1 m² → cpe,1: A −1.4, B −1.1; C −0.5 is beaten by the leeward E of the wind onto the
      // opposite face, h/d = 15/12 = 1.25 → E = −0.5 − 0.25/4·0.2 = −0.5125 (interpolated between h/d 1 and 5).
      expect(res.body.zones.map((z: { cpe: number }) => z.cpe)).toEqual([-1.4, -1.1, expect.closeTo(-0.5125, 6)])
      // wEd = 1.5·1105.2·1.4 = 2.321 kN/m², ÷ 0.15 kN = 15.5 → 16/m² in A; B 1.824 → 12.2 → 13/m²;
      // C 0.850 → 5.7 → the system minimum of 6 governs.
      expect([byZone.A.perM2, byZone.B.perM2, byZone.C.perM2]).toEqual([16, 13, 6])
      expect(byZone.C.governs).toBe('minimum')
      // Areas with 20 % openings: A 2 × 2.4 × 15 × 0.8 = 57.6 m² → 922; B 2 × 9.6 × 15 × 0.8 = 230.4 m² → 2996;
      // C 6 × 15 × 0.8 = 72 m² → 432.
      expect([byZone.A.count, byZone.B.count, byZone.C.count]).toEqual([922, 2996, 432])
      expect(res.body.layout.total).toBe(922 + 2996 + 432)
      expect(res.body.caution).toMatch(/chartered structural engineer/)
      // The server's answer is the engine's own.
      expect(res.body.layout.total).toBe(windAnchors(wind).layout.total)
    })

    it('gives terrain III a lower qp', async () => {
      // Hand-derived, EN 1991-1-4 §4.3–4.5, terrain III (z0 = 0.3 m): kr = 0.19·(0.3/0.05)^0.07 = 0.2154,
      // ln(15/0.3) = 3.912, vm = 21.91 m/s, Iv = 0.2556, qp = (1 + 7·0.2556)·0.625·21.91² = 837 Pa.
      const res = await call('/api/calc/wind', { body: { ...wind, terrain: 'III' }, cookie: officer })
      expect(res.status).toBe(200)
      expect(res.body.pressure.qp).toBeCloseTo(836.7, 0)
    })

    it.each([
      [{ ...wind, vb: -3 }, 400, /vb: Basic wind velocity vb must be greater than zero/],
      [{ ...wind, terrain: 'V' }, 400, /terrain: Terrain category must be 0, I, II, III or IV/],
      // 60 storeys of 4 m = 240 m is above the 200 m top of the EN 1991-1-4 profile: the engine refuses it.
      [{ ...wind, storeys: 60, storeyHeight_m: 4 }, 422, /must not exceed 200 m/],
    ])('refuses bad input readably (%#)', async (body, status, message) => {
      const res = await call('/api/calc/wind', { body, cookie: officer })
      expect(res.status).toBe(status)
      expect(res.body.message).toMatch(message)
    })
  })

  describe('wall strength', () => {
    it('shows K and γM from the preset and returns Φ, NRd and the failed checks', async () => {
      const res = await call('/api/calc/strength', { body: strength, cookie: officer })
      expect(res.status).toBe(200)
      // value recalled from EN 1996-1-1 Table 3.3: K = 0.8 for Group 1 aggregate concrete in thin-layer mortar;
      // recalled from the Note to §2.4.3(1): γM = 1.7 for category I units, class 2, designed mortar.
      expect(res.body.K).toMatchObject({ value: 0.8, from: 'preset' })
      expect(res.body.gammaM).toMatchObject({ value: 1.7, from: 'preset' })
      // EN 1996-1-1 Expression 3.3: fk = K·fb^0.85.
      expect(res.body.strength.fk).toBeCloseTo(0.8 * res.body.units.fb ** 0.85, 10)
      expect(res.body.resistance.NRd_kNm).toBeCloseTo(res.body.resistance.phi * 300 * res.body.strength.fk / 1.7, 8)
      expect(res.body.resistance.failedChecks).toEqual([])
      expect(res.body.caution).toMatch(/chartered structural engineer/)
    })

    it('lists a failed slenderness check plainly', async () => {
      // EN 1996-1-1 §5.5.1.4: hef/tef ≤ 27; 1.0 × 3.0 m / 100 mm = 30.
      const res = await call('/api/calc/strength', { body: { ...strength, wall: { ...strength.wall, t_mm: 100, h_m: 3, rho: 1 } }, cookie: officer })
      expect(res.status).toBe(200)
      expect(res.body.resistance.failedChecks.join(' ')).toMatch(/Slenderness hef\/tef = 30\.0 exceeds 27/)
    })

    it.each([
      [{ ...strength, annex: { ...strength.annex, presetId: 'nowhere' } }, 400, /annex.presetId: Choose a National Annex preset/],
      [{ ...strength, wall: { method: 'annex-g', t_mm: 300, h_m: 2.7, rho: 0.75 } }, 400, /wall.topEccentricity_mm: Top eccentricity is needed/],
      // The recalled UK preset holds no K for Group 2 clay units in thin-layer mortar.
      [{ ...strength, annex: { ...strength.annex, presetId: 'uk-na-recalled', unit: 'clay', group: 2, executionClass: '1' } }, 422, /holds no K .* enter K by hand/],
    ])('refuses bad input readably (%#)', async (body, status, message) => {
      const res = await call('/api/calc/strength', { body, cookie: officer })
      expect(res.status).toBe(status)
      expect(res.body.message).toMatch(message)
    })
  })

  describe('quantities and programme', () => {
    it('answers the take-off with editable waste', async () => {
      const res = await call('/api/calc/quantities', { body: { ...quantities, waste: { blocks: 0 } }, cookie: officer })
      expect(res.status).toBe(200)
      const blocks = res.body.lines.find((l: { item: string }) => l.item === 'blocks')
      // Geometry (common practice, coordinating size): 1e6 / ((440 + 3)(215 + 3)) = 10.3547 units/m² × 480 m² = 4970.3 → 4971 with no waste.
      expect(blocks.net).toBeCloseTo(4970.28, 1)
      expect(blocks.wastePercent).toBe(0)
      expect(blocks.gross).toBe(4971)
      const bad = await call('/api/calc/quantities', { body: { ...quantities, openings_m2: 700 }, cookie: officer })
      expect(bad.status).toBe(400)
      expect(bad.body.message).toMatch(/openings_m2: Openings must be smaller than the wall area/)
    })

    it('answers the programme, single leaf faster than the cavity wall', async () => {
      const res = await call('/api/calc/programme', { body: programme, cookie: officer })
      expect(res.status).toBe(200)
      expect(res.body.singleLeaf.days).toBeLessThan(res.body.cavity.days)
      expect(res.body.assumptions.every((a: { basis: string }) => a.basis === 'common practice')).toBe(true)
      // common practice: a single leaf has half the courses of a two-leaf wall when the courses are the same height.
      const same = await call('/api/calc/programme', { body: { ...programme, assumptions: { thinJointJoint_mm: 10 } }, cookie: officer })
      expect(same.status).toBe(200)
      expect(same.body.singleLeaf.totalCourses * 2).toBe(same.body.cavity.totalCourses)
      expect(same.body.assumptions.find((a: { key: string }) => a.key === 'thinJointJoint_mm').basis).toBe('user')
    })
  })

  describe('saving the new methods to an enquiry', () => {
    it.each([
      ['wind-anchors', wind],
      ['wall-strength', strength],
      ['quantities', quantities],
      ['programme', programme],
    ])('saves %s: the server re-runs it and keeps its own outputs', async (method, inputs) => {
      const res = await call(`/api/enquiries/${ref3}/calculations`, { body: { method, inputs }, cookie: officer })
      expect(res.status, JSON.stringify(res.body)).toBe(201)
      expect(res.body.calculation.method).toBe(method)
      const list = await call(`/api/enquiries/${ref3}/calculations`, { cookie: specB })
      expect(list.status).toBe(200)
      const saved = list.body.calculations.find((c: { id: number }) => c.id === res.body.calculation.id)
      expect(saved.method).toBe(method)
      if (method === 'wind-anchors') expect(saved.outputs.layout.total).toBe(4350)
    })

    it('refuses a saved calculation with bad inputs by field', async () => {
      const res = await call(`/api/enquiries/${ref3}/calculations`, { body: { method: 'wind-anchors', inputs: { ...wind, storeys: 0 } }, cookie: officer })
      expect(res.status).toBe(400)
      expect(res.body.message).toMatch(/^inputs\.storeys: At least one storey/)
    })
  })

  describe('price book', () => {
    it('lets staff read it, with the demo prices marked, and nobody else', async () => {
      expect((await call('/api/price-book')).status).toBe(401)
      expect((await call('/api/price-book', { cookie: specA })).status).toBe(403)
      const res = await call<{ items: PriceBookRow[] }>('/api/price-book', { cookie: officer })
      expect(res.status).toBe(200)
      expect(res.body.items.length).toBeGreaterThan(10)
      expect(res.body.items.every(i => i.demo && /demo price, invented/.test(i.description))).toBe(true)
      expect(res.body.items.map(i => i.kind)).toEqual(expect.arrayContaining(['material', 'labour-lay', 'labour-system', 'delivery']))
    })

    it('lets a manager change a price and refuses an officer', async () => {
      const before = (await call<{ items: PriceBookRow[] }>('/api/price-book', { cookie: officer })).body.items.find(i => i.code === 'diagonal-patches')!
      expect((await call('/api/price-book/diagonal-patches', { method: 'PUT', body: { unitPriceCents: 1 }, cookie: officer })).status).toBe(403)
      expect((await call('/api/price-book/diagonal-patches', { method: 'PUT', body: { unitPriceCents: 1 }, cookie: specA })).status).toBe(403)
      const bad = await call('/api/price-book/diagonal-patches', { method: 'PUT', body: { unitPriceCents: 1.5 }, cookie: manager })
      expect(bad.status).toBe(400)
      expect(bad.body.message).toMatch(/unitPriceCents: Unit price must be whole cents/)
      expect((await call('/api/price-book/no-such-code', { method: 'PUT', body: { unitPriceCents: 100 }, cookie: manager })).status).toBe(404)
      const res = await call('/api/price-book/diagonal-patches', { method: 'PUT', body: { unitPriceCents: before.unitPriceCents + 10 }, cookie: manager })
      expect(res.status).toBe(200)
      expect(res.body.item.unitPriceCents).toBe(before.unitPriceCents + 10)
      const after = (await call<{ items: PriceBookRow[] }>('/api/price-book', { cookie: officer })).body.items.find(i => i.code === 'diagonal-patches')!
      expect(after.unitPriceCents).toBe(before.unitPriceCents + 10)
      // Put the demo price back for the other tests.
      expect((await call('/api/price-book/diagonal-patches', { method: 'PUT', body: { unitPriceCents: before.unitPriceCents }, cookie: manager })).status).toBe(200)
    })
  })

  describe('quotations', () => {
    const body: CreateQuotationInput = { scope: 'full-system', quantities, discountPercent: 5, vatPercent: 23, validUntil: `${year + 1}-01-31`, deliveryCode: 'DEL-Z2' }

    it('is saved by staff only and checks its input', async () => {
      expect((await call(`/api/enquiries/${ref3}/quotations`, { body: {} })).status).toBe(401)
      expect((await call(`/api/enquiries/${ref3}/quotations`, { body: {}, cookie: specB })).status).toBe(403)
      const empty = await call(`/api/enquiries/${ref3}/quotations`, { body: {}, cookie: officer })
      expect(empty.status).toBe(400)
      expect(empty.body.message).toMatch(/^scope: Choose supply, supply and lay, or the full system/)
      const zone = await call(`/api/enquiries/${ref3}/quotations`, { body: { ...body, deliveryCode: 'DEL-NOWHERE' }, cookie: officer })
      expect(zone.status).toBe(422)
      expect(zone.body.message).toMatch(/No active delivery zone with code DEL-NOWHERE/)
      const date = await call(`/api/enquiries/${ref3}/quotations`, { body: { ...body, validUntil: '31/01/2027' }, cookie: officer })
      expect(date.status).toBe(400)
      expect(date.body.message).toMatch(/validUntil: Valid until must be a date/)
      expect((await call(`/api/enquiries/TQ-${year}-9999/quotations`, { body, cookie: officer })).status).toBe(404)
    })

    it('saves revision A then B, each with its PDF, and never changes A', async () => {
      const book = (await call<{ items: PriceBookRow[] }>('/api/price-book', { cookie: officer })).body.items
      const expected = buildQuotation(body, book).quote
      const existing = (await call(`/api/enquiries/${ref3}/quotations`, { cookie: officer })).body.quotations as { revision: string }[]
      const letters = 'ABCDEFGHIJKLMNOPQRSTUVWXYZ'
      const first = letters[existing.length]!

      const a = await call(`/api/enquiries/${ref3}/quotations`, { body, cookie: officer })
      expect(a.status, JSON.stringify(a.body)).toBe(201)
      expect(a.body.quotation.revision).toBe(first)
      expect(a.body.quotation.totalCents).toBe(expected.total_cents)
      expect(a.body.quotation.vatCents).toBe(expected.vat_cents)
      expect(a.body.quotation.pdfUrl).toBe(`/api/enquiries/${ref3}/attachments/${a.body.quotation.attachmentId}`)
      // Full system: materials, both labour rates and the zone-2 delivery.
      const kinds = new Set(a.body.quotation.lines.map((l: { kind: string }) => l.kind))
      expect([...kinds].sort()).toEqual(['delivery', 'labour', 'material'])

      const pdfA = await download(a.body.quotation.pdfUrl, officer)
      const text = (await pdfText(pdfA.slice())).text
      const blocks = a.body.quotation.lines.find((l: { code: string }) => l.code === 'blocks')
      expect(text).toContain('Corrstone lightweight-aggregate block')
      expect(text).toContain(formatCents(blocks.amount))
      expect(text).toContain(`Total € ${formatCents(expected.total_cents)}`)
      expect(text).toContain('Demo prices — invented')
      expect(text).toContain(`Valid until ${body.validUntil}`)
      // The enquiry's own organisation reads the PDF too (it goes out in the response pack).
      await download(a.body.quotation.pdfUrl, specB)

      const b = await call(`/api/enquiries/${ref3}/quotations`, { body: { ...body, scope: 'supply', discountPercent: 0 }, cookie: officer })
      expect(b.status).toBe(201)
      expect(b.body.quotation.revision).toBe(letters[existing.length + 1])
      expect(b.body.quotation.lines.every((l: { kind: string }) => l.kind !== 'labour')).toBe(true)
      expect(b.body.quotation.totalCents).toBeLessThan(a.body.quotation.totalCents)

      const list = await call(`/api/enquiries/${ref3}/quotations`, { cookie: specB })
      expect(list.status).toBe(200)
      const savedA = list.body.quotations.find((q: { revision: string }) => q.revision === first)
      expect(savedA.totalCents).toBe(a.body.quotation.totalCents)
      expect(savedA.scope).toBe('full-system')
      expect(Buffer.from(await download(savedA.pdfUrl, officer)).equals(Buffer.from(pdfA))).toBe(true)
    })

    it('is listed for staff and the own organisation only', async () => {
      expect((await call(`/api/enquiries/${ref3}/quotations`)).status).toBe(401)
      expect((await call(`/api/enquiries/${ref3}/quotations`, { cookie: specA })).status).toBe(404)
      expect((await call(`/api/enquiries/${ref3}/quotations`, { cookie: specB })).status).toBe(200)
      expect((await call(`/api/enquiries/${ref3}/quotations`, { cookie: manager })).status).toBe(200)
    })
  })
})
