import { $fetch, fetch, url } from '@nuxt/test-utils/e2e'
import { describe, expect, it } from 'vitest'
import { ENGINE_VERSION, uValue } from '../../shared/calc'
import type { UValueInput } from '../../shared/calc'
import { useBuiltServer } from '../support/server'
import { demoWall as baseWall } from '../support/walls'

const DEMO_PASSWORD = 'corrstone-demo-2026'
const year = new Date().getUTCFullYear()
const ref1 = `TQ-${year}-0001` // seeded: Glenmore Terrace, Halloran Reid Architects

/** The demo wall with six point bridges per m² (anchors through the insulation). */
const demoWall: UValueInput = { ...baseWall, pointBridges: [{ perM2: 6, chi: 0.002 }] }

function json(body: unknown, cookie?: string): RequestInit {
  return {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'origin': url('/').replace(/\/$/, ''), ...(cookie ? { cookie } : {}) },
    body: JSON.stringify(body),
  }
}

async function signIn(email: string): Promise<string> {
  const res = await fetch('/api/auth/sign-in', json({ email, password: DEMO_PASSWORD }))
  expect(res.status, `sign-in of ${email}`).toBe(200)
  const cookie = res.headers.getSetCookie().find(c => c.startsWith('perpend-session='))
  expect(cookie).toBeTruthy()
  return cookie!.split(';')[0]!
}

async function errorBody(res: Response): Promise<{ statusCode: number, message: string, data?: Record<string, unknown> }> {
  return await res.json() as { statusCode: number, message: string, data?: Record<string, unknown> }
}

describe('calculation API', async () => {
  await useBuiltServer()

  describe('public methods', () => {
    it('answers the U-value anonymously with the engine\'s own result and its caution', async () => {
      const res = await fetch('/api/calc/u-value', json(demoWall))
      expect(res.status).toBe(200)
      const body = await res.json() as ReturnType<typeof uValue>
      const engine = uValue(demoWall)
      expect(body.u).toBeCloseTo(engine.u, 12)
      expect(body.uRounded).toBe(engine.uRounded)
      expect(body.caution).toMatch(/not a compliance certificate/)
      expect(body.standard.join(' ')).toMatch(/EN ISO 6946/)
      expect(res.headers.get('ratelimit-limit')).toBe('60')
    })

    it('gives U = 1/ΣR for an unbridged wall', async () => {
      // common practice, hand-calculated: 0.13 + 0.2/0.04 + 0.04 = 5.17 m²K/W, U = 1/5.17 = 0.1934 W/m²K
      const body = await $fetch<{ u: number, uRounded: number }>('/api/calc/u-value', {
        method: 'POST',
        headers: { origin: url('/').replace(/\/$/, '') },
        body: { layers: [{ thickness_mm: 200, lambda: 0.04 }] },
      })
      expect(body.u).toBeCloseTo(1 / 5.17, 6)
      expect(body.uRounded).toBe(0.19)
    })

    it('answers the dew point anonymously', async () => {
      // common practice: psychrometric tables give a dew point of 9.3 °C for air at 20 °C and 50 % RH
      const res = await fetch('/api/calc/dew-point', json({ tempC: 20, rhPercent: 50 }))
      expect(res.status).toBe(200)
      const body = await res.json() as { dewPointC: number, caution: string }
      expect(body.dewPointC).toBeCloseTo(9.3, 1)
      expect(body.caution).toMatch(/Indicative/)
    })
  })

  describe('refusals', () => {
    it.each([
      ['/api/calc/condensation'],
      ['/api/calc/condensation-year'],
      ['/api/calc/mould'],
      ['/api/calc/bridging'],
      ['/api/calc/thickness'],
      [`/api/enquiries/${ref1}/calculations`],
      ['/api/calculations/1/rerun'],
    ])('%s answers 401 to the public', async (path) => {
      const res = await fetch(path, json({}))
      expect(res.status).toBe(401)
    })

    it('refuses to list an enquiry\'s calculations to the public', async () => {
      const res = await fetch(`/api/enquiries/${ref1}/calculations`)
      expect(res.status).toBe(401)
    })

    it.each([
      ['a negative thickness', '/api/calc/u-value', { layers: [{ thickness_mm: -5, lambda: 0.3 }] }, /Layer thickness must be greater than zero/],
      ['λ of zero', '/api/calc/u-value', { layers: [{ thickness_mm: 100, lambda: 0 }] }, /Layer λ must be greater than zero/],
      ['a bridge fraction of 1', '/api/calc/u-value', { layers: [{ thickness_mm: 100, lambda: 0.3, bridge: { lambda: 0.8, fraction: 1 } }] }, /Bridge fraction must be below 1/],
      ['no layers', '/api/calc/u-value', { layers: [] }, /Add at least one layer/],
      ['RH above 100 %', '/api/calc/dew-point', { tempC: 20, rhPercent: 120 }, /Relative humidity cannot exceed 100 %/],
      ['a temperature as text', '/api/calc/dew-point', { tempC: 'warm', rhPercent: 50 }, /Temperature must be a number/],
    ])('answers 400 with a readable message for %s', async (_case, path, body, message) => {
      const res = await fetch(path, json(body))
      expect(res.status).toBe(400)
      expect((await errorBody(res)).message).toMatch(message)
    })

    it('refuses a write without an Origin header (CSRF guard)', async () => {
      const res = await fetch('/api/calc/u-value', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(demoWall) })
      expect(res.status).toBe(403)
    })
  })

  describe('staff methods', () => {
    it('answers 422 with the engine\'s message when a target U cannot be reached', async () => {
      const cookie = await signIn('officer@corrstone.example')
      const res = await fetch('/api/calc/thickness', json({ ...demoWall, layerIndex: 2, targetU: 0.01 }, cookie))
      expect(res.status).toBe(422)
      const body = await errorBody(res)
      expect(body.message).toMatch(/cannot be reached by this layer within 500 mm/)
      expect(body.data).toMatchObject({ field: 'targetU' })
    })

    it('finds the least insulation thickness for U = 0.15 and runs the other methods for an officer', async () => {
      const cookie = await signIn('officer@corrstone.example')
      const sized = await (await fetch('/api/calc/thickness', json({ ...demoWall, layerIndex: 2, targetU: 0.15 }, cookie))).json() as { thickness_mm: number, u: number }
      expect(sized.u).toBeLessThanOrEqual(0.15)
      // One step thinner must miss the target, or the answer was not the least thickness.
      const thinner = uValue({ ...demoWall, layers: demoWall.layers.map((l, i) => (i === 2 ? { ...l, thickness_mm: sized.thickness_mm - 10 } : l)) })
      expect(thinner.u).toBeGreaterThan(0.15)

      const bridging = await fetch('/api/calc/bridging', json({ junctions: [{ psi: 0.05, length_m: 30 }], exposedArea_m2: 100 }, cookie))
      // common practice, hand-calculated: HTB = 0.05 × 30 = 1.5 W/K; y = 1.5/100 = 0.015 W/m²K
      expect(bridging.status).toBe(200)
      expect(await bridging.json()).toMatchObject({ htb: 1.5, yValue: 0.015 })

      const mould = await fetch('/api/calc/mould', json({ u: 0.2, outsideTempC: 0 }, cookie))
      // common practice, hand-calculated: fRsi = 1 − 0.2 × 0.25 = 0.95, above the dwelling minimum 0.75
      expect(await mould.json()).toMatchObject({ fRsi: 0.95, pass: true })

      const steady = await fetch('/api/calc/condensation', json({ layers: [{ thickness_mm: 100, lambda: 0.04, mu: 1 }, { thickness_mm: 10, lambda: 1, mu: 1000 }], inside: { tempC: 20, rhPercent: 60 }, outside: { tempC: 0, rhPercent: 80 } }, cookie))
      const s = await steady.json() as { planes: number[], rate: number }
      // A vapour-tight layer on the cold side of vapour-open insulation condenses at their interface (common practice).
      expect(s.planes).toEqual([1])
      expect(s.rate).toBeGreaterThan(0)
    })

    it('refuses the staff methods to a specifier', async () => {
      const cookie = await signIn('architect@hallorans.example')
      const res = await fetch('/api/calc/mould', json({ u: 0.2, outsideTempC: 0 }, cookie))
      expect(res.status).toBe(403)
    })
  })

  describe('saved calculations', () => {
    it('saves the server\'s own result with engine version and author, lists it and re-runs it unchanged', async () => {
      const cookie = await signIn('officer@corrstone.example')
      const forged = { u: 0.01, uRounded: 0.01 }
      const res = await fetch(`/api/enquiries/${ref1}/calculations`, json({ method: 'u-value', inputs: demoWall, outputs: forged }, cookie))
      expect(res.status).toBe(201)
      const { calculation } = await res.json() as { calculation: { id: number, enquiryRef: string, method: string, outputs: { u: number }, engineVersion: string, createdBy: { name: string } } }
      expect(calculation.enquiryRef).toBe(ref1)
      expect(calculation.method).toBe('u-value')
      expect(calculation.engineVersion).toBe(ENGINE_VERSION)
      expect(calculation.createdBy.name).toBe('Niamh Brennan')
      // The client's outputs are ignored: the server ran the engine itself.
      expect(calculation.outputs.u).toBeCloseTo(uValue(demoWall).u, 12)

      const list = await (await fetch(`/api/enquiries/${ref1}/calculations`, { headers: { cookie } })).json() as { calculations: { id: number, inputs: UValueInput }[] }
      const listed = list.calculations.find(c => c.id === calculation.id)
      expect(listed?.inputs.layers).toHaveLength(5)

      const rerun = await fetch(`/api/calculations/${calculation.id}/rerun`, json({}, cookie))
      expect(rerun.status).toBe(200)
      const r = await rerun.json() as { identical: boolean, differences: unknown[], savedEngineVersion: string, currentEngineVersion: string, current: { u: number } }
      expect(r).toMatchObject({ identical: true, differences: [], savedEngineVersion: ENGINE_VERSION, currentEngineVersion: ENGINE_VERSION })
      expect(r.current.u).toBeCloseTo(calculation.outputs.u, 12)

      // Re-running stores nothing.
      const after = await (await fetch(`/api/enquiries/${ref1}/calculations`, { headers: { cookie } })).json() as { calculations: unknown[] }
      expect(after.calculations).toHaveLength(list.calculations.length)
    })

    it('lets the enquiry\'s own organisation read the list, and answers 404 to another firm', async () => {
      const own = await signIn('architect@hallorans.example')
      const res = await fetch(`/api/enquiries/${ref1}/calculations`, { headers: { cookie: own } })
      expect(res.status).toBe(200)
      expect(((await res.json()) as { calculations: unknown[] }).calculations.length).toBeGreaterThan(0)

      const other = await signIn('architect@brightwater.example')
      expect((await fetch(`/api/enquiries/${ref1}/calculations`, { headers: { cookie: other } })).status).toBe(404)
      // A specifier cannot save or re-run, even on their own enquiry.
      expect((await fetch(`/api/enquiries/${ref1}/calculations`, json({ method: 'u-value', inputs: demoWall }, own))).status).toBe(403)
      expect((await fetch('/api/calculations/1/rerun', json({}, own))).status).toBe(403)
    })

    it.each([
      ['an unknown method', { method: 'wind-load', inputs: {} }, 400, /Method must be one of/],
      ['inputs the method refuses', { method: 'u-value', inputs: { layers: [{ thickness_mm: 0, lambda: 0.3 }] } }, 400, /inputs\.layers\.0\.thickness_mm: Layer thickness must be greater than zero/],
      ['inputs the engine cannot use', { method: 'thickness', inputs: { ...demoWall, layerIndex: 2, targetU: 0.01 } }, 422, /cannot be reached/],
    ])('refuses to save %s', async (_case, body, status, message) => {
      const cookie = await signIn('officer@corrstone.example')
      const res = await fetch(`/api/enquiries/${ref1}/calculations`, json(body, cookie))
      expect(res.status).toBe(status)
      expect((await errorBody(res)).message).toMatch(message)
    })

    it('answers 404 for an enquiry or a calculation that does not exist', async () => {
      const cookie = await signIn('officer@corrstone.example')
      expect((await fetch('/api/enquiries/TQ-1999-9999/calculations', json({ method: 'dew-point', inputs: { tempC: 20, rhPercent: 50 } }, cookie))).status).toBe(404)
      expect((await fetch('/api/calculations/999999999/rerun', json({}, cookie))).status).toBe(404)
    })
  })

  describe('rate limit', () => {
    it('answers 429 with Retry-After once an address passes 60 dew points a minute, and keeps the U-value open', async () => {
      let limited: Response | null = null
      for (let i = 0; i < 62 && !limited; i++) {
        const res = await fetch('/api/calc/dew-point', json({ tempC: 20, rhPercent: 50 }))
        if (res.status === 429) limited = res
        else expect(res.status).toBe(200)
      }
      expect(limited).not.toBeNull()
      const retryAfter = Number(limited!.headers.get('retry-after'))
      expect(retryAfter).toBeGreaterThanOrEqual(1)
      expect(retryAfter).toBeLessThanOrEqual(60)
      expect((await errorBody(limited!)).message).toMatch(/60 calculations a minute .* Try again in \d+ seconds?/)
      // Each public method counts on its own.
      expect((await fetch('/api/calc/u-value', json(demoWall))).status).toBe(200)
    })
  })
})
