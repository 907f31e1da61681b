import { describe, expect, it } from 'vitest'
import { CalcInputError, bridgingHeatLoss } from '../../../shared/calc/index'

describe('bridgingHeatLoss: HTB = Σψ·L, y = HTB/ΣA (recalled from EN ISO 14683)', () => {
  // A house, derived by hand: 30 m of lintels at 0.05, 25 m of sills at 0.04, 60 m of jambs at 0.05,
  // 40 m of ground floor at 0.16, 20 m of corners at 0.09:
  // HTB = 1.5 + 1.0 + 3.0 + 6.4 + 1.8 = 13.7 W/K over 250 m² → y = 0.0548 W/m²K
  const house = [
    { name: 'Lintel', psi: 0.05, length_m: 30 },
    { name: 'Sill', psi: 0.04, length_m: 25 },
    { name: 'Jamb', psi: 0.05, length_m: 60 },
    { name: 'Ground floor', psi: 0.16, length_m: 40 },
    { name: 'Corner', psi: 0.09, length_m: 20 },
  ]

  it('adds the junctions', () => {
    const r = bridgingHeatLoss({ junctions: house, exposedArea_m2: 250 })
    expect(r.htb).toBeCloseTo(13.7, 12)
    expect(r.yValue).toBeCloseTo(0.0548, 12)
    expect(r.junctions[3]!.heatLoss).toBeCloseTo(6.4, 12)
    expect(r.caution).toMatch(/EN ISO 10211/)
  })

  it.each([
    // default y 0.15 and 0.08 — published: Technical Guidance Document L (Ireland), Appendix D
    ['default', 0.15, 37.5, true],
    ['acceptable-details', 0.08, 20, true],
  ])('compares with the %s y = %d (HTB %d W/K)', (id, y, htb, atOrBelow) => {
    const r = bridgingHeatLoss({ junctions: house, exposedArea_m2: 250 })
    const c = r.comparisons.find(x => x.id === id)!
    expect(c.y).toBe(y)
    expect(c.htb).toBeCloseTo(htb, 12)
    expect(c.atOrBelow).toBe(atOrBelow)
    expect(c.saving).toBeCloseTo(htb - 13.7, 12)
    expect(c.source).toMatch(/^published: Technical Guidance Document L/)
  })

  it('a poor ground-floor junction puts y between the two defaults', () => {
    // 0.5 W/mK over 40 m → HTB = 1.5 + 1.0 + 3.0 + 20 + 1.8 = 27.3 W/K → y = 0.1092
    const poor = house.map(j => (j.name === 'Ground floor' ? { ...j, psi: 0.5 } : j))
    const r = bridgingHeatLoss({ junctions: poor, exposedArea_m2: 250 })
    expect(r.yValue).toBeCloseTo(0.1092, 12)
    expect(r.comparisons.map(c => c.atOrBelow)).toEqual([true, false])
  })

  it('adds point bridges χ·n and allows negative ψ at external corners', () => {
    const r = bridgingHeatLoss({ junctions: [{ psi: -0.05, length_m: 20 }], exposedArea_m2: 100, points: [{ chi: 0.01, count: 50 }] })
    expect(r.htb).toBeCloseTo(-1 + 0.5, 12)
    expect(r.yValue).toBeCloseTo(-0.005, 12)
  })

  it('no junctions: zero heat loss', () => {
    expect(bridgingHeatLoss({ junctions: [], exposedArea_m2: 10 }).htb).toBe(0)
  })

  it.each([
    ['exposedArea_m2', { junctions: [], exposedArea_m2: 0 }],
    ['exposedArea_m2', { junctions: [], exposedArea_m2: -5 }],
    ['junctions[0].length_m', { junctions: [{ psi: 0.05, length_m: -1 }], exposedArea_m2: 10 }],
    ['junctions[0].psi', { junctions: [{ psi: Number.NaN, length_m: 1 }], exposedArea_m2: 10 }],
    ['junctions[0].psi', { junctions: [{ psi: 5, length_m: 1 }], exposedArea_m2: 10 }],
    ['points[0].count', { junctions: [], exposedArea_m2: 10, points: [{ chi: 0.01, count: 1.5 }] }],
    ['junctions', { exposedArea_m2: 10 }],
  ])('rejects a bad %s', (field, input) => {
    let error: unknown
    try {
      bridgingHeatLoss(input as never)
    }
    catch (e) {
      error = e
    }
    expect(error).toBeInstanceOf(CalcInputError)
    expect((error as CalcInputError).field).toBe(field)
  })
})
