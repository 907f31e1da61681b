/**
 * Design values for the workbench's material picker. Every figure carries the source it was taken from, so that
 * a report can say whether a value was read in a published table, recalled from a standard whose text is
 * licensed, is common practice, or is one of the demo supplier's declared values. Generic values are the
 * middle of the range the source gives; a supplier's declared value replaces them for its own products.
 */

export type SourceTag = `published: ${string}` | `recalled: ${string}` | 'practice' | 'declared demo value'

export type MaterialCategory =
  | 'masonry' | 'mortar' | 'insulation' | 'plaster' | 'render' | 'board' | 'fixing'

export interface Material {
  id: string
  name: string
  category: MaterialCategory
  /** Design thermal conductivity, W/mK. */
  lambda: number
  /** Water-vapour resistance factor μ (the value the Glaser method uses); null for vapour-tight metals. */
  mu: number | null
  /** The second μ of a dry-cup / wet-cup pair, where the source gives one. */
  muWet?: number
  /** Density, kg/m³. */
  density: number
  sources: { lambda: SourceTag, mu: SourceTag, density: SourceTag }
  /** Thickness the material is usually laid at, mm. */
  typicalThickness_mm?: number
  /** Unit face for masonry, mm, so the joint fraction can be found. */
  unit?: { length_mm: number, height_mm: number, joint_mm: number }
  /** Declared point transmittance per anchor, W/K (ETICS anchors). */
  chi?: number
  /** True for the demo supplier's products. */
  demo?: true
  supplier?: string
  note?: string
}

const GOV_SCOT = 'published: Scottish Government, Tables of U-values and thermal conductivity (2020)'
const ISO_10456 = 'recalled: EN ISO 10456 tabulated design values'

export const DEMO_SUPPLIER = 'Corrstone Building Systems Ltd (invented demo supplier)'

/** Generic materials: trade values, not any maker's declaration. */
export const GENERIC_MATERIALS: readonly Material[] = [
  {
    id: 'lwa-block-1000', name: 'Lightweight aggregate block, about 1000 kg/m³', category: 'masonry',
    lambda: 0.4, mu: 5, muWet: 15, density: 1000,
    sources: { lambda: 'recalled: EN ISO 10456 / CIBSE Guide A, 0.3–0.6 W/mK by density', mu: ISO_10456, density: 'practice' },
    typicalThickness_mm: 215, unit: { length_mm: 440, height_mm: 215, joint_mm: 10 },
  },
  {
    id: 'lwa-block-1400', name: 'Lightweight aggregate block, about 1400 kg/m³', category: 'masonry',
    lambda: 0.57, mu: 5, muWet: 15, density: 1400,
    sources: { lambda: 'recalled: EN ISO 10456 / CIBSE Guide A, 0.3–0.6 W/mK by density', mu: ISO_10456, density: 'practice' },
    typicalThickness_mm: 215, unit: { length_mm: 440, height_mm: 215, joint_mm: 10 },
  },
  {
    id: 'dense-block', name: 'Dense aggregate concrete block', category: 'masonry',
    lambda: 1.13, mu: 60, muWet: 100, density: 2000,
    sources: { lambda: 'recalled: EN ISO 10456 / CIBSE Guide A, 1.1–1.35 W/mK', mu: ISO_10456, density: 'practice' },
    typicalThickness_mm: 100, unit: { length_mm: 440, height_mm: 215, joint_mm: 10 },
  },
  {
    id: 'aircrete-block', name: 'Aircrete block', category: 'masonry',
    lambda: 0.11, mu: 10, density: 475,
    sources: { lambda: GOV_SCOT, mu: ISO_10456, density: 'practice' },
    typicalThickness_mm: 100, unit: { length_mm: 440, height_mm: 215, joint_mm: 10 },
  },
  {
    id: 'clay-brick', name: 'Clay brick outer leaf', category: 'masonry',
    lambda: 0.77, mu: 10, muWet: 5, density: 1700,
    sources: { lambda: 'published: Scottish Government, 6.B Worked examples (2020), example 6.B.3', mu: ISO_10456, density: 'practice' },
    typicalThickness_mm: 102, unit: { length_mm: 215, height_mm: 65, joint_mm: 10 },
  },
  {
    id: 'mortar-gp', name: 'General-purpose mortar (protected)', category: 'mortar',
    lambda: 0.88, mu: 15, muWet: 35, density: 1750,
    sources: { lambda: GOV_SCOT, mu: ISO_10456, density: 'practice' },
    typicalThickness_mm: 10,
  },
  {
    id: 'mortar-thin-layer', name: 'Thin-layer mortar', category: 'mortar',
    lambda: 0.88, mu: 15, muWet: 35, density: 1600,
    sources: { lambda: 'practice', mu: 'practice', density: 'practice' },
    typicalThickness_mm: 3,
    note: 'Taken as general-purpose mortar: the joints are too thin for the difference to matter.',
  },
  {
    id: 'eps-white', name: 'EPS insulation board, white', category: 'insulation',
    lambda: 0.037, mu: 60, density: 15,
    sources: { lambda: 'recalled: EN ISO 10456 / CIBSE Guide A, 0.036–0.038 W/mK', mu: 'recalled: EN ISO 10456, μ 20–100', density: 'practice' },
    typicalThickness_mm: 150,
  },
  {
    id: 'eps-graphite', name: 'EPS insulation board, graphite-enhanced', category: 'insulation',
    lambda: 0.031, mu: 60, density: 15,
    sources: { lambda: 'recalled: EN ISO 10456 / CIBSE Guide A, 0.030–0.032 W/mK', mu: 'recalled: EN ISO 10456, μ 20–100', density: 'practice' },
    typicalThickness_mm: 150,
  },
  {
    id: 'mineral-wool-slab', name: 'Mineral wool facade slab', category: 'insulation',
    lambda: 0.036, mu: 1, density: 140,
    sources: { lambda: 'recalled: EN ISO 10456 / CIBSE Guide A, 0.035–0.040 W/mK', mu: ISO_10456, density: 'practice' },
    typicalThickness_mm: 150,
  },
  {
    id: 'mineral-wool-batt', name: 'Mineral wool batt (cavity or stud fill)', category: 'insulation',
    lambda: 0.038, mu: 1, density: 30,
    sources: { lambda: GOV_SCOT, mu: ISO_10456, density: 'practice' },
    typicalThickness_mm: 100,
  },
  {
    id: 'phenolic-board', name: 'Phenolic foam board', category: 'insulation',
    lambda: 0.021, mu: 35, density: 35,
    sources: { lambda: 'practice', mu: 'practice', density: 'practice' },
    typicalThickness_mm: 100,
    note: 'Declared values of phenolic boards run 0.018–0.023 W/mK; use the maker\'s declaration.',
  },
  {
    id: 'gypsum-plaster', name: 'Gypsum plaster', category: 'plaster',
    lambda: 0.57, mu: 10, muWet: 6, density: 1300,
    sources: { lambda: 'recalled: EN ISO 10456 / CIBSE Guide A, 0.40–0.57 W/mK', mu: ISO_10456, density: ISO_10456 },
    typicalThickness_mm: 13,
  },
  {
    id: 'gypsum-plaster-light', name: 'Lightweight gypsum plaster', category: 'plaster',
    lambda: 0.4, mu: 10, muWet: 6, density: 1000,
    sources: { lambda: 'recalled: EN ISO 10456 / CIBSE Guide A, 0.40–0.57 W/mK', mu: ISO_10456, density: ISO_10456 },
    typicalThickness_mm: 13,
  },
  {
    id: 'cement-sand-render', name: 'Cement-sand render', category: 'render',
    lambda: 1, mu: 10, muWet: 6, density: 1800,
    sources: { lambda: 'recalled: EN ISO 10456 / CIBSE Guide A', mu: ISO_10456, density: ISO_10456 },
    typicalThickness_mm: 20,
  },
  {
    id: 'etics-base-coat', name: 'ETICS base coat with glass-fibre mesh', category: 'render',
    lambda: 0.8, mu: 25, density: 1500,
    sources: { lambda: 'practice', mu: 'practice', density: 'practice' },
    typicalThickness_mm: 5,
  },
  {
    id: 'render-silicone', name: 'Silicone thin-coat finish', category: 'render',
    lambda: 0.7, mu: 75, density: 1700,
    sources: { lambda: 'practice', mu: 'practice', density: 'practice' },
    typicalThickness_mm: 2,
    note: 'μ chosen so that 2 mm gives sd ≈ 0.15 m, inside the usual 0.1–0.2 m.',
  },
  {
    id: 'render-acrylic', name: 'Acrylic thin-coat finish', category: 'render',
    lambda: 0.7, mu: 300, density: 1700,
    sources: { lambda: 'practice', mu: 'practice', density: 'practice' },
    typicalThickness_mm: 2,
    note: 'μ chosen so that 2 mm gives sd ≈ 0.6 m, inside the usual 0.3–1 m.',
  },
  {
    id: 'render-mineral', name: 'Mineral thin-coat finish', category: 'render',
    lambda: 0.8, mu: 25, density: 1600,
    sources: { lambda: 'practice', mu: 'practice', density: 'practice' },
    typicalThickness_mm: 2,
    note: 'μ chosen so that 2 mm gives sd ≈ 0.05 m, below the usual 0.1 m.',
  },
  {
    id: 'plasterboard', name: 'Gypsum plasterboard', category: 'board',
    lambda: 0.21, mu: 10, muWet: 4, density: 700,
    sources: { lambda: GOV_SCOT, mu: ISO_10456, density: 'practice' },
    typicalThickness_mm: 12.5,
  },
  {
    id: 'timber-softwood', name: 'Softwood timber (studs, battens)', category: 'board',
    lambda: 0.13, mu: 50, muWet: 20, density: 500,
    sources: { lambda: GOV_SCOT, mu: ISO_10456, density: ISO_10456 },
  },
  {
    id: 'stainless-steel', name: 'Stainless steel (fixings)', category: 'fixing',
    lambda: 17, mu: null, density: 7900,
    sources: { lambda: 'recalled: EN ISO 10456 / CIBSE Guide A', mu: ISO_10456, density: ISO_10456 },
  },
  {
    id: 'carbon-steel', name: 'Carbon steel (fixings)', category: 'fixing',
    lambda: 50, mu: null, density: 7800,
    sources: { lambda: 'recalled: EN ISO 10456 / CIBSE Guide A', mu: ISO_10456, density: ISO_10456 },
  },
  {
    id: 'polyamide', name: 'Polyamide (anchor sleeves and plates)', category: 'fixing',
    lambda: 0.25, mu: 50000, density: 1150,
    sources: { lambda: 'recalled: EN ISO 10456 / CIBSE Guide A', mu: ISO_10456, density: ISO_10456 },
  },
]

const demoSources = { lambda: 'declared demo value', mu: 'declared demo value', density: 'declared demo value' } as const

/** The demo supplier's own products. The company and all of its figures are invented for the demo. */
export const DEMO_MATERIALS: readonly Material[] = [
  {
    id: 'corrstone-block-215', name: 'Corrstone thin-joint lightweight block 215 (demo)', category: 'masonry',
    lambda: 0.29, mu: 5, muWet: 10, density: 950, sources: demoSources, demo: true, supplier: DEMO_SUPPLIER,
    typicalThickness_mm: 215, unit: { length_mm: 440, height_mm: 215, joint_mm: 3 },
  },
  {
    id: 'corrstone-thin-joint-mortar', name: 'Corrstone thin-joint mortar (demo)', category: 'mortar',
    lambda: 0.83, mu: 15, muWet: 35, density: 1550, sources: demoSources, demo: true, supplier: DEMO_SUPPLIER,
    typicalThickness_mm: 3,
  },
  {
    id: 'corrstone-eps-graphite', name: 'Corrstone ETICS board, graphite EPS (demo)', category: 'insulation',
    lambda: 0.031, mu: 40, density: 16, sources: demoSources, demo: true, supplier: DEMO_SUPPLIER,
    typicalThickness_mm: 150,
  },
  {
    id: 'corrstone-base-coat', name: 'Corrstone base coat and mesh (demo)', category: 'render',
    lambda: 0.8, mu: 20, density: 1450, sources: demoSources, demo: true, supplier: DEMO_SUPPLIER,
    typicalThickness_mm: 5,
  },
  {
    id: 'corrstone-silicone-finish', name: 'Corrstone silicone finish 1.5 mm (demo)', category: 'render',
    lambda: 0.7, mu: 80, density: 1700, sources: demoSources, demo: true, supplier: DEMO_SUPPLIER,
    typicalThickness_mm: 1.5,
  },
  {
    id: 'corrstone-anchor', name: 'Corrstone screw anchor, steel pin in polyamide sleeve (demo)', category: 'fixing',
    lambda: 50, mu: null, density: 7800, sources: demoSources, demo: true, supplier: DEMO_SUPPLIER,
    chi: 0.002,
    note: 'Counted by its declared point transmittance χ, not by the Annex F fastener formula.',
  },
]

/** The picker's list: the demo supplier's products first, then the generic values. */
export const MATERIALS: readonly Material[] = [...DEMO_MATERIALS, ...GENERIC_MATERIALS]

/** The material with this id, or undefined. */
export function findMaterial(id: string): Material | undefined {
  return MATERIALS.find(m => m.id === id)
}
