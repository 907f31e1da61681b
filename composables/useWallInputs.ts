import { CalcInputError, jointFraction } from '~/shared/calc'
import type { CondensationAtInput, CondensationYearInput, UValueInput, UValueLayer, VapourLayer } from '~/shared/calc'
import { useWorkbenchStore } from '~/stores/workbench'
import type { WallLayer } from '~/stores/workbench'

/** The mortar (or other bridge) fraction of a layer, from its joints when they are given. */
export function bridgeFraction(layer: WallLayer, index: number): number {
  const b = layer.bridge
  if (!b) return 0
  if (!b.joints) return num(b.fraction)
  try {
    return jointFraction({ unitLength_mm: num(b.joints.unitLength_mm), unitHeight_mm: num(b.joints.unitHeight_mm), joint_mm: num(b.joints.joint_mm) })
  }
  catch (e) {
    if (e instanceof CalcInputError) throw new CalcInputError(`layers[${index}].bridge.${e.field}`, `Layer ${index + 1}: ${e.message}`)
    throw e
  }
}

function thermalLayer(l: WallLayer, i: number): UValueLayer {
  if (l.kind === 'resistance') return { name: l.name, resistance: num(l.resistance) }
  const layer: UValueLayer = { name: l.name, thickness_mm: num(l.thickness_mm), lambda: num(l.lambda) }
  if (l.bridge) {
    const fraction = bridgeFraction(l, i)
    // Joints of zero width leave nothing to bridge: the layer is then homogeneous.
    if (fraction > 0) layer.bridge = { lambda: num(l.bridge.lambda), fraction }
  }
  return layer
}

/** The wall as the U-value engine takes it. */
export function useWallInputs() {
  const wb = useWorkbenchStore()

  const uValueInput = (): UValueInput => {
    const input: UValueInput = {
      layers: wb.layers.map(thermalLayer),
      rsi: num(wb.rsi),
      rse: num(wb.rse),
    }
    if (wb.fixings.length) {
      input.fixings = wb.fixings.map(f => ({ layerIndex: f.layerIndex, perM2: num(f.perM2), diameter_mm: num(f.diameter_mm), lambda: num(f.lambda) }))
    }
    if (wb.anchors.perM2 !== null || wb.anchors.chi !== null) {
      input.pointBridges = [{ perM2: num(wb.anchors.perM2), chi: num(wb.anchors.chi) }]
    }
    if (wb.airGapLevel) input.airGapLevel = wb.airGapLevel
    return input
  }

  // The Glaser method is one-dimensional: a bridged layer is taken at its main material's λ and μ.
  const vapourLayers = (): VapourLayer[] => wb.layers.map(l => (l.kind === 'resistance'
    ? { name: l.name, resistance: num(l.resistance), sd: num(l.sd) }
    : { name: l.name, thickness_mm: num(l.thickness_mm), lambda: num(l.lambda), mu: num(l.mu) }))

  const condensationAtInput = (): CondensationAtInput => ({
    layers: vapourLayers(),
    inside: { tempC: num(wb.steady.inside.tempC), rhPercent: num(wb.steady.inside.rhPercent) },
    outside: { tempC: num(wb.steady.outside.tempC), rhPercent: num(wb.steady.outside.rhPercent) },
    rsi: num(wb.rsi),
    rse: num(wb.rse),
  })

  const condensationYearInput = (): CondensationYearInput => ({
    layers: vapourLayers(),
    climate: wb.climate.map(c => ({ tempC: num(c.tempC), rhPercent: num(c.rhPercent) })),
    internal: wb.internal.mode === 'class'
      ? { tempC: num(wb.internal.tempC), humidityClass: wb.internal.humidityClass }
      : { tempC: num(wb.internal.tempC), rhPercent: num(wb.internal.rhPercent) },
    rsi: num(wb.rsi),
    rse: num(wb.rse),
  })

  return { uValueInput, condensationAtInput, condensationYearInput, vapourLayers }
}
