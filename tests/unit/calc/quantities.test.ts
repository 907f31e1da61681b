import { describe, expect, it } from 'vitest'
import { CalcInputError } from '../../../shared/calc/errors'
import {
  DEFAULT_WASTE_PERCENT,
  QUANTITY_ITEMS,
  WALL_SYSTEM_DEFAULTS,
  blocksPerM2,
  mortarPerM2,
  wallQuantities,
  type QuantityItem,
  type WallQuantitiesInput,
} from '../../../shared/calc/quantities'
import { wallQuantitiesInput } from '../../../shared/calc/schemas2'

describe('blocks per m²', () => {
  it.each<[number, number, number, number, string]>([
    // derived by hand: 1e6/((440+10)(215+10)) = 1e6/101250 = 9.8765 (domain reference: 9.88)
    [440, 215, 10, 9.87654, '10 mm general-purpose joints'],
    // derived by hand: 1e6/((440+3)(215+3)) = 1e6/96574 = 10.3548 (domain reference: 10.35)
    [440, 215, 3, 10.35475, '3 mm thin-layer joints'],
    // derived by hand: 1e6/(500·250) = 8
    [500, 250, 0, 8, 'no joint'],
  ])('%s × %s mm with %s mm joints → %s per m² (%s)', (l, h, j, n) => {
    expect(blocksPerM2({ unitLength_mm: l, unitHeight_mm: h, joint_mm: j })).toBeCloseTo(n, 4)
  })

  it('rounds to the commonly quoted 9.88 and 10.35', () => {
    expect(blocksPerM2({ unitLength_mm: 440, unitHeight_mm: 215, joint_mm: 10 }).toFixed(2)).toBe('9.88')
    expect(blocksPerM2({ unitLength_mm: 440, unitHeight_mm: 215, joint_mm: 3 }).toFixed(2)).toBe('10.35')
  })

  it.each<[string, Record<string, number>, string]>([
    ['zero length', { unitLength_mm: 0, unitHeight_mm: 215, joint_mm: 3 }, 'unitLength_mm'],
    ['negative joint', { unitLength_mm: 440, unitHeight_mm: 215, joint_mm: -1 }, 'joint_mm'],
    ['NaN height', { unitLength_mm: 440, unitHeight_mm: Number.NaN, joint_mm: 3 }, 'unitHeight_mm'],
  ])('rejects %s', (_n, input, field) => {
    try {
      blocksPerM2(input as never)
      expect.unreachable('should have thrown')
    } catch (e) {
      expect(e).toBeInstanceOf(CalcInputError)
      expect((e as CalcInputError).field).toBe(field)
    }
  })
})

describe('mortar per m²', () => {
  it.each<[number, number, 'filled' | 'unfilled', number, number, string]>([
    // derived by hand: f = 1 − 94600/101250 = 0.065679 (6.6 %); 0.065679 × 0.100 m = 6.568 L/m²
    [10, 100, 'filled', 0.065679, 6.5679, 'beds 4.444 L + perpends 2.123 L'],
    // derived by hand: f = 1 − 94600/96574 = 0.020440 (2.0 %); × 0.100 m = 2.044 L/m²
    [3, 100, 'filled', 0.02044, 2.044, 'thin-layer, filled perpends'],
    // derived by hand: beds only, 3/218 = 0.013761; × 0.300 m = 4.128 L/m²
    [3, 300, 'unfilled', 0.013761, 4.1284, 'thin-layer, dry tongue-and-groove perpends'],
  ])('%s mm joints in a %s mm wall, perpends %s → fraction %s, %s L/m² (%s)', (j, t, perpends, fraction, litres) => {
    const r = mortarPerM2({ unitLength_mm: 440, unitHeight_mm: 215, joint_mm: j, wallThickness_mm: t, perpends })
    expect(r.jointAreaFraction).toBeCloseTo(fraction, 5)
    expect(r.litres).toBeCloseTo(litres, 3)
    expect(r.m3).toBeCloseTo(litres / 1000, 6)
  })

  it('a 3 mm thin joint uses less than a third of the mortar of a 10 mm joint (derived from the two cases above)', () => {
    const thick = mortarPerM2({ unitLength_mm: 440, unitHeight_mm: 215, joint_mm: 10, wallThickness_mm: 100 }).litres
    const thin = mortarPerM2({ unitLength_mm: 440, unitHeight_mm: 215, joint_mm: 3, wallThickness_mm: 100 }).litres
    expect(thin / thick).toBeLessThan(1 / 3)
  })

  it('rejects a zero wall thickness and an unknown perpend option', () => {
    expect(() => mortarPerM2({ unitLength_mm: 440, unitHeight_mm: 215, joint_mm: 3, wallThickness_mm: 0 })).toThrow(CalcInputError)
    expect(() => mortarPerM2({ unitLength_mm: 440, unitHeight_mm: 215, joint_mm: 3, wallThickness_mm: 100, perpends: 'half' as never })).toThrow(
      /perpends/,
    )
  })
})

describe('practice facts', () => {
  it('thin-layer joints default to about 3 mm (common practice; EN 1996-1-1 allows 0.5–3 mm, recalled)', () => {
    expect(WALL_SYSTEM_DEFAULTS.joint_mm).toBe(3)
  })
  it('ETICS anchors default to at least 6 per m² (common practice)', () => {
    expect(WALL_SYSTEM_DEFAULTS.minimumAnchorsPerM2).toBe(6)
  })
  it('an EPS board 1200 × 600 covers 0.72 m² (common practice board size)', () => {
    expect((WALL_SYSTEM_DEFAULTS.boardLength_mm * WALL_SYSTEM_DEFAULTS.boardHeight_mm) / 1e6).toBeCloseTo(0.72, 12)
  })
})

describe('wall quantities', () => {
  const base: WallQuantitiesInput = {
    area_m2: 100,
    openings_m2: 10,
    baseLength_m: 30,
    openingsCount: 5,
    openingsPerimeter_m: 40,
    openingHeads_m: 6,
    externalCorners_m: 12,
    system: { block: { length_mm: 440, height_mm: 215, thickness_mm: 300, joint_mm: 3, perpends: 'unfilled' } },
  }

  // Derived by hand for 90 m² net, defaults (common practice) for every rate and waste allowance:
  it.each<[QuantityItem, string, number, number, number, string]>([
    ['blocks', 'nr', 931.928, 5, 979, '10.35475 × 90; × 1.05 = 978.5'],
    ['thin-layer-mortar', 'bag', 23.2225, 10, 26, '4.12844 L/m² × 90 = 371.56 L ÷ 16 L; × 1.10 = 25.5'],
    ['starter-mortar', 'bag', 9.642857, 15, 12, '30 m × 0.30 m × 0.015 m = 135 L ÷ 14 L; × 1.15 = 11.09'],
    ['insulation-boards', 'board', 125, 7, 134, '90 ÷ 0.72; × 1.07 = 133.75'],
    ['adhesive', 'bag', 18, 10, 20, '5 kg/m² × 90 ÷ 25 kg; × 1.10 = 19.8'],
    ['anchors', 'nr', 540, 5, 567, 'system minimum 6/m² × 90; × 1.05'],
    ['mesh', 'm²', 100, 10, 110, '90 × 1.0/(1.0 − 0.1) for 100 mm laps'],
    ['diagonal-patches', 'nr', 20, 0, 20, '5 openings × 4'],
    ['base-coat', 'bag', 18, 10, 20, '5 kg/m² × 90 ÷ 25 kg'],
    ['primer', 'kg', 18, 10, 20, '0.2 kg/m² × 90'],
    ['finish', 'kg', 225, 10, 248, '2.5 kg/m² × 90; × 1.10 = 247.5'],
    ['base-track', 'm', 30, 10, 33, 'base length'],
    ['corner-bead', 'm', 52, 10, 58, '12 m corners + 40 m reveals; × 1.10 = 57.2'],
    ['drip-bead', 'm', 6, 10, 7, 'heads 6 m; × 1.10 = 6.6'],
  ])('%s: %s net %s, waste %s %% → gross %s (%s)', (item, unit, net, waste, gross) => {
    const r = wallQuantities(base)
    const line = r.lines.find((l) => l.item === item)!
    expect(line.unit).toBe(unit)
    expect(line.net).toBeCloseTo(net, 3)
    expect(line.wastePercent).toBe(waste)
    expect(line.gross).toBe(gross)
    expect(line.basis.length).toBeGreaterThan(0)
  })

  it('lists every item once, in order, with the default waste (common practice)', () => {
    const r = wallQuantities(base)
    expect(r.netArea_m2).toBe(90)
    expect(r.lines.map((l) => l.item)).toEqual([...QUANTITY_ITEMS])
    for (const l of r.lines) expect(l.wastePercent).toBe(DEFAULT_WASTE_PERCENT[l.item])
  })

  it('takes the waste allowance the user edits', () => {
    const r = wallQuantities({ ...base, waste: { blocks: 0, finish: 20 } })
    expect(r.lines.find((l) => l.item === 'blocks')!.gross).toBe(932) // ceil(931.928)
    expect(r.lines.find((l) => l.item === 'finish')!.gross).toBe(270) // 225 × 1.2
    expect(r.lines.find((l) => l.item === 'mesh')!.wastePercent).toBe(10)
  })

  it.each<[string, Partial<WallQuantitiesInput>, string, number]>([
    // derived by hand: 8/m² × 90 = 720
    ['anchors per m² from the wind result', { anchorsPerM2: 8 }, 'wind-per-m2', 720],
    ['anchor count from the zone layout', { anchorsPerM2: 8, anchorCount: 700 }, 'wind-layout', 700],
    ['system minimum of the system description', { system: { ...base.system, anchors: { minimumPerM2: 8 } } }, 'system-minimum', 720],
  ])('anchors: %s', (_n, change, source, net) => {
    const r = wallQuantities({ ...base, ...change })
    expect(r.anchorsSource).toBe(source)
    expect(r.lines.find((l) => l.item === 'anchors')!.net).toBeCloseTo(net, 9)
  })

  it('uses the system description’s own rates in place of the defaults', () => {
    const r = wallQuantities({
      ...base,
      system: { ...base.system, adhesive: { kgPerM2: 4, bagKg: 20 }, insulation: { boardLength_mm: 1000, boardHeight_mm: 500, thickness_mm: 160 } },
    })
    expect(r.lines.find((l) => l.item === 'adhesive')!.net).toBeCloseTo(18, 12) // 4 × 90 / 20
    const boards = r.lines.find((l) => l.item === 'insulation-boards')!
    expect(boards.net).toBeCloseTo(180, 12) // 90 / 0.5
    expect(boards.label).toMatch(/160 mm/)
  })

  it.each<[string, Partial<WallQuantitiesInput>, string]>([
    ['openings as large as the wall', { openings_m2: 100 }, 'openings_m2'],
    ['zero area', { area_m2: 0 }, 'area_m2'],
    ['waste above 100 %', { waste: { blocks: 150 } }, 'waste.blocks'],
    ['fractional openings count', { openingsCount: 2.5 }, 'openingsCount'],
    ['no base length', { baseLength_m: Number.NaN }, 'baseLength_m'],
    ['mesh lap wider than the roll', { system: { ...base.system, mesh: { rollWidth_m: 0.1, lap_mm: 100 } } }, 'system.mesh.lap_mm'],
    ['negative block thickness', { system: { block: { length_mm: 440, height_mm: 215, thickness_mm: -1 } } }, 'system.block.thickness_mm'],
  ])('rejects %s', (_n, change, field) => {
    try {
      wallQuantities({ ...base, ...change })
      expect.unreachable('should have thrown')
    } catch (e) {
      expect(e).toBeInstanceOf(CalcInputError)
      expect((e as CalcInputError).field).toBe(field)
    }
  })

  it('the schema accepts the worked input and rejects openings larger than the wall', () => {
    expect(wallQuantitiesInput.safeParse(base).success).toBe(true)
    expect(wallQuantitiesInput.safeParse({ ...base, openings_m2: 120 }).success).toBe(false)
    expect(wallQuantitiesInput.safeParse({ ...base, waste: { bricks: 5 } }).success).toBe(false)
  })
})
