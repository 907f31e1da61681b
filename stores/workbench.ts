import { defineStore } from 'pinia'
import { DEMO_MATERIALS, findMaterial } from '~/shared/calc'
import type { ClimatePoint, MaterialCategory, MouldUse } from '~/shared/calc'

/** A layer of the wall being built, inside first. Numbers are null while a field is empty. */
export interface WallLayer {
  key: number
  name: string
  materialId: string | null
  category: MaterialCategory | 'air'
  /** 'material': thickness, λ, μ; 'resistance': an air layer or declared R with its sd. */
  kind: 'material' | 'resistance'
  thickness_mm: number | null
  lambda: number | null
  mu: number | null
  resistance: number | null
  sd: number | null
  /** Drawing width of a resistance layer, mm; it does not enter any calculation. */
  drawnThickness_mm: number | null
  bridge: null | {
    materialId: string | null
    name: string
    lambda: number | null
    /** The fraction is worked out from the unit face and joint when these are given (jointFraction). */
    joints: null | { unitLength_mm: number | null, unitHeight_mm: number | null, joint_mm: number | null }
    fraction: number | null
  }
}

export interface FixingRow {
  layerIndex: number
  perM2: number | null
  diameter_mm: number | null
  lambda: number | null
}

export interface JunctionRow {
  key: number
  name: string
  psi: number | null
  length_m: number | null
}

export type Internal = { tempC: number | null, mode: 'class', humidityClass: 1 | 2 | 3 | 4 | 5, rhPercent: number | null }
  | { tempC: number | null, mode: 'rh', humidityClass: 1 | 2 | 3 | 4 | 5, rhPercent: number | null }

export interface ClimatePreset {
  id: string
  label: string
  source: string
  months: ClimatePoint[]
}

/**
 * Monthly climates for trying the method. Both are INVENTED for illustration (rounded, plausible shapes), not
 * measured data: a design check takes the site's own monthly means from a met service.
 */
export const CLIMATE_PRESETS: ClimatePreset[] = [
  {
    id: 'mild-maritime',
    label: 'Mild maritime (invented, illustrative)',
    source: 'Invented illustrative dataset shaped like a mild Atlantic coastal climate; not design data',
    months: [
      { tempC: 5.0, rhPercent: 88 }, { tempC: 5.2, rhPercent: 86 }, { tempC: 6.5, rhPercent: 83 },
      { tempC: 8.3, rhPercent: 79 }, { tempC: 10.8, rhPercent: 78 }, { tempC: 13.4, rhPercent: 79 },
      { tempC: 15.0, rhPercent: 80 }, { tempC: 14.8, rhPercent: 81 }, { tempC: 13.0, rhPercent: 83 },
      { tempC: 10.4, rhPercent: 86 }, { tempC: 7.3, rhPercent: 88 }, { tempC: 5.7, rhPercent: 89 },
    ],
  },
  {
    id: 'cold-inland',
    label: 'Cold inland winter (invented, illustrative)',
    source: 'Invented illustrative dataset with a hard winter, to show how condensation builds up; not design data',
    months: [
      { tempC: -6.0, rhPercent: 88 }, { tempC: -4.5, rhPercent: 85 }, { tempC: 0.5, rhPercent: 80 },
      { tempC: 6.5, rhPercent: 74 }, { tempC: 12.0, rhPercent: 70 }, { tempC: 15.5, rhPercent: 70 },
      { tempC: 17.5, rhPercent: 71 }, { tempC: 17.0, rhPercent: 73 }, { tempC: 12.5, rhPercent: 78 },
      { tempC: 7.0, rhPercent: 83 }, { tempC: 1.0, rhPercent: 87 }, { tempC: -4.0, rhPercent: 89 },
    ],
  },
]

let nextKey = 1

function materialLayer(materialId: string, thickness_mm: number, bridge?: { materialId: string, joints: { unitLength_mm: number, unitHeight_mm: number, joint_mm: number } }): WallLayer {
  const m = findMaterial(materialId)
  if (!m) throw new Error(`Unknown material ${materialId}`)
  const b = bridge ? findMaterial(bridge.materialId) : undefined
  return {
    key: nextKey++,
    name: m.name,
    materialId: m.id,
    category: m.category,
    kind: 'material',
    thickness_mm,
    lambda: m.lambda,
    mu: m.mu,
    resistance: null,
    sd: null,
    drawnThickness_mm: null,
    bridge: bridge && b ? { materialId: b.id, name: b.name, lambda: b.lambda, joints: { ...bridge.joints }, fraction: null } : null,
  }
}

function airLayer(name: string, resistance: number, sd: number, drawnThickness_mm: number): WallLayer {
  return {
    key: nextKey++, name, materialId: null, category: 'air', kind: 'resistance',
    thickness_mm: null, lambda: null, mu: null, resistance, sd, drawnThickness_mm, bridge: null,
  }
}

export interface WallPreset {
  id: string
  label: string
  description: string
  build: () => { layers: WallLayer[], fixings: FixingRow[], anchors: { perM2: number | null, chi: number | null } }
}

const demoBlock = DEMO_MATERIALS.find(m => m.id === 'corrstone-block-215')!
const demoAnchor = DEMO_MATERIALS.find(m => m.id === 'corrstone-anchor')!

export const WALL_PRESETS: WallPreset[] = [
  {
    id: 'corrstone-etics',
    label: 'Corrstone single-leaf insulated wall (demo)',
    description: '13 mm plaster, 215 mm Corrstone block on 3 mm thin joints, 150 mm graphite EPS, base coat and silicone finish; 6 anchors per m². Demo values are invented.',
    build: () => ({
      layers: [
        materialLayer('gypsum-plaster', 13),
        materialLayer('corrstone-block-215', 215, { materialId: 'corrstone-thin-joint-mortar', joints: { unitLength_mm: demoBlock.unit!.length_mm, unitHeight_mm: demoBlock.unit!.height_mm, joint_mm: demoBlock.unit!.joint_mm } }),
        materialLayer('corrstone-eps-graphite', 150),
        materialLayer('corrstone-base-coat', 5),
        materialLayer('corrstone-silicone-finish', 1.5),
      ],
      fixings: [],
      anchors: { perM2: 6, chi: demoAnchor.chi ?? null },
    }),
  },
  {
    id: 'two-leaf-cavity',
    label: 'Two-leaf cavity wall, partial fill (for comparison)',
    description: '13 mm plaster, 100 mm dense block on 10 mm joints, 100 mm phenolic board, 50 mm clear cavity, 102 mm brick; stainless ties at 2.5 per m².',
    build: () => ({
      layers: [
        materialLayer('gypsum-plaster', 13),
        materialLayer('dense-block', 100, { materialId: 'mortar-gp', joints: { unitLength_mm: 440, unitHeight_mm: 215, joint_mm: 10 } }),
        materialLayer('phenolic-board', 100),
        // Unventilated cavity over 25 mm, horizontal heat flow: R = 0.18 m²K/W [recalled: EN ISO 6946:2017
        // Table 8]; still air has μ = 1, so 50 mm gives sd = 0.05 m.
        airLayer('Clear cavity, unventilated, 50 mm', 0.18, 0.05, 50),
        materialLayer('clay-brick', 102, { materialId: 'mortar-gp', joints: { unitLength_mm: 215, unitHeight_mm: 65, joint_mm: 10 } }),
      ],
      fixings: [{ layerIndex: 2, perM2: 2.5, diameter_mm: 4, lambda: 17 }],
      anchors: { perM2: null, chi: null },
    }),
  },
]

/** The wall being built and the conditions around it, shared by every workbench page. */
export const useWorkbenchStore = defineStore('workbench', () => {
  const presetId = ref<string>('corrstone-etics')
  const first = WALL_PRESETS[0]!.build()
  const layers = ref<WallLayer[]>(first.layers)
  const fixings = ref<FixingRow[]>(first.fixings)
  const anchors = ref(first.anchors)
  const rsi = ref<number | null>(0.13)
  const rse = ref<number | null>(0.04)
  const airGapLevel = ref<0 | 1 | 2>(0)

  const steady = ref({
    inside: { tempC: 20 as number | null, rhPercent: 60 as number | null },
    outside: { tempC: -1 as number | null, rhPercent: 90 as number | null },
  })
  const climatePresetId = ref<string | null>('mild-maritime')
  const climate = ref<{ tempC: number | null, rhPercent: number | null }[]>(CLIMATE_PRESETS[0]!.months.map(m => ({ ...m })))
  const internal = ref<Internal>({ tempC: 20, mode: 'class', humidityClass: 3, rhPercent: 60 })

  const mould = ref<{ useWallU: boolean, u: number | null, inside: { tempC: number | null, rhPercent: number | null }, outsideTempC: number | null, use: MouldUse }>({
    useWallU: true,
    u: 0.15,
    inside: { tempC: 20, rhPercent: 60 },
    outsideTempC: 0,
    use: 'dwelling',
  })

  const junctions = ref<JunctionRow[]>([])
  const exposedArea_m2 = ref<number | null>(null)

  function loadPreset(id: string) {
    const preset = WALL_PRESETS.find(p => p.id === id)
    if (!preset) return
    const built = preset.build()
    presetId.value = id
    layers.value = built.layers
    fixings.value = built.fixings
    anchors.value = built.anchors
  }

  function loadClimate(id: string) {
    const preset = CLIMATE_PRESETS.find(p => p.id === id)
    if (!preset) return
    climatePresetId.value = id
    climate.value = preset.months.map(m => ({ ...m }))
  }

  function addLayer(materialId = 'eps-white') {
    const m = findMaterial(materialId)
    const layer = materialLayer(materialId, m?.typicalThickness_mm ?? 50)
    // Keys restored from the server render may be above this module's counter: stay clear of them.
    layer.key = Math.max(0, ...layers.value.map(l => l.key)) + 1
    layers.value.push(layer)
    presetId.value = ''
  }

  function removeLayer(index: number) {
    layers.value.splice(index, 1)
    // Fixings point at layers by index: drop the ones that lost their layer, shift the ones after it.
    fixings.value = fixings.value
      .filter(f => f.layerIndex !== index)
      .map(f => (f.layerIndex > index ? { ...f, layerIndex: f.layerIndex - 1 } : f))
    presetId.value = ''
  }

  function moveLayer(index: number, by: -1 | 1) {
    const to = index + by
    if (to < 0 || to >= layers.value.length) return
    const list = [...layers.value]
    ;[list[index], list[to]] = [list[to]!, list[index]!]
    layers.value = list
    fixings.value = fixings.value.map(f => ({ ...f, layerIndex: f.layerIndex === index ? to : f.layerIndex === to ? index : f.layerIndex }))
    presetId.value = ''
  }

  function setMaterial(index: number, materialId: string) {
    const layer = layers.value[index]
    const m = findMaterial(materialId)
    if (!layer || !m) return
    layer.materialId = m.id
    layer.name = m.name
    layer.category = m.category
    layer.kind = 'material'
    layer.lambda = m.lambda
    layer.mu = m.mu
    layer.thickness_mm ??= m.typicalThickness_mm ?? 50
    presetId.value = ''
  }

  /** Index of the layer a target-U search sizes: the insulation layer of highest resistance. */
  const insulationIndex = computed(() => {
    let best = -1
    let bestR = -1
    layers.value.forEach((l, i) => {
      if (l.category !== 'insulation' || l.kind !== 'material') return
      const r = (l.thickness_mm ?? 0) / (l.lambda ?? Infinity)
      if (r > bestR) {
        best = i
        bestR = r
      }
    })
    return best
  })

  return {
    presetId, layers, fixings, anchors, rsi, rse, airGapLevel,
    steady, climatePresetId, climate, internal, mould, junctions, exposedArea_m2,
    insulationIndex, loadPreset, loadClimate, addLayer, removeLayer, moveLayer, setMaterial,
  }
})
