import { describe, expect, it } from 'vitest'
import {
  DEMO_MATERIALS,
  ENGINE_VERSION,
  GENERIC_MATERIALS,
  MATERIALS,
  U_TARGETS,
  checkTarget,
  findMaterial,
  jointFraction,
  targetsFor,
  uValue,
} from '../../../shared/calc/index'

const SOURCE = /^(published: .+|recalled: .+|practice|declared demo value)$/

describe('materials list', () => {
  it.each(MATERIALS.map(m => [m.id, m] as const))('%s carries plausible values, each with its source', (_id, m) => {
    expect(m.lambda).toBeGreaterThan(0)
    expect(m.lambda).toBeLessThanOrEqual(60)
    expect(m.density).toBeGreaterThan(0)
    if (m.mu !== null) expect(m.mu).toBeGreaterThanOrEqual(1)
    else expect(m.category).toBe('fixing')
    for (const key of ['lambda', 'mu', 'density'] as const) expect(m.sources[key]).toMatch(SOURCE)
  })

  it('ids are unique and findMaterial finds each', () => {
    const ids = MATERIALS.map(m => m.id)
    expect(new Set(ids).size).toBe(ids.length)
    for (const id of ids) expect(findMaterial(id)?.id).toBe(id)
    expect(findMaterial('no-such-material')).toBeUndefined()
  })

  it('covers the kinds the workbench needs', () => {
    const names = GENERIC_MATERIALS.map(m => m.name.toLowerCase()).join(' | ')
    for (const word of ['block', 'mortar', 'thin-layer mortar', 'eps', 'graphite', 'mineral wool', 'phenolic', 'plaster', 'render', 'plasterboard', 'steel', 'polyamide']) {
      expect(names).toContain(word)
    }
  })

  it('puts the demo supplier first, every value marked as a declared demo value', () => {
    expect(MATERIALS.slice(0, DEMO_MATERIALS.length)).toEqual(DEMO_MATERIALS)
    for (const m of DEMO_MATERIALS) {
      expect(m.demo).toBe(true)
      expect(m.name).toMatch(/^Corrstone /)
      expect(m.supplier).toMatch(/invented/)
      expect(Object.values(m.sources).every(s => s === 'declared demo value')).toBe(true)
    }
    for (const m of GENERIC_MATERIALS) {
      expect(m.demo).toBeUndefined()
      expect(Object.values(m.sources)).not.toContain('declared demo value')
    }
  })

  it.each([
    // published: Scottish Government tables / worked example 6.B.3
    ['mortar-gp', 0.88],
    ['aircrete-block', 0.11],
    ['plasterboard', 0.21],
    ['clay-brick', 0.77],
  ])('%s uses the published λ %d', (id, lambda) => {
    const m = findMaterial(id)!
    expect(m.lambda).toBe(lambda)
    expect(m.sources.lambda).toMatch(/^published: Scottish Government/)
  })

  it('the demo block with thin joints builds a wall the engine can calculate', () => {
    const block = findMaterial('corrstone-block-215')!
    const mortar = findMaterial('corrstone-thin-joint-mortar')!
    const eps = findMaterial('corrstone-eps-graphite')!
    const f = jointFraction({ unitLength_mm: block.unit!.length_mm, unitHeight_mm: block.unit!.height_mm, joint_mm: block.unit!.joint_mm })
    expect(f).toBeCloseTo(0.0204, 4) // computed from the formula, domain notes §1
    const r = uValue({
      layers: [
        { thickness_mm: 215, lambda: block.lambda, bridge: { lambda: mortar.lambda, fraction: f } },
        { thickness_mm: 150, lambda: eps.lambda },
      ],
      pointBridges: [{ perM2: 6, chi: findMaterial('corrstone-anchor')!.chi! }],
    })
    expect(r.u).toBeGreaterThan(0.1)
    expect(r.u).toBeLessThan(0.25)
  })
})

describe('regulatory targets (domain notes §7)', () => {
  it.each([
    // published: TGD L 2019 Table 1 (Ireland), new dwellings
    ['ie-tgdl-2019-wall', 0.18, /^published: TGD L 2019/],
    ['ie-tgdl-2019-roof', 0.16, /^published: TGD L 2019/],
    ['ie-tgdl-2019-floor', 0.18, /^published: TGD L 2019/],
    ['ie-tgdl-2019-window-door', 1.4, /^published: TGD L 2019/],
    // recalled: Approved Document L 2021 Volume 1
    ['en-adl-2021-wall-limiting', 0.26, /^recalled: Approved Document L 2021/],
    ['en-adl-2021-wall-notional', 0.18, /^recalled: Approved Document L 2021/],
  ])('%s = %d W/m²K', (id, u, source) => {
    const t = U_TARGETS.find(x => x.id === id)!
    expect(t.u).toBe(u)
    expect(t.source).toMatch(source)
  })

  it('compares the unrounded U', () => {
    expect(checkTarget(0.1849, 'ie-tgdl-2019-wall').meets).toBe(false) // rounds to 0.18 but is above it
    expect(checkTarget(0.18, 'ie-tgdl-2019-wall').meets).toBe(true)
    expect(checkTarget(0.15, 'ie-tgdl-2019-wall').margin).toBeCloseTo(0.03, 12)
    expect(checkTarget(0.2, 'en-adl-2021-wall-limiting').caution).toMatch(/not compliance/)
    expect(targetsFor('wall').map(t => t.id)).toEqual(['ie-tgdl-2019-wall', 'en-adl-2021-wall-limiting', 'en-adl-2021-wall-notional'])
    expect(() => checkTarget(0.2, 'nowhere')).toThrow(/Unknown/)
  })

  it('engine version is a semantic version', () => {
    expect(ENGINE_VERSION).toMatch(/^\d+\.\d+\.\d+$/)
  })
})
