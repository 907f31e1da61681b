/**
 * The wall-strength method of the workbench: unit test strength → fb → fk → NRd, with K and γM read from a named
 * National Annex preset (or entered by hand) and shown beside the result. Composition only; the formulas live in
 * shared/calc/masonry.ts.
 */
import { z } from 'zod'
import {
  characteristicStrength,
  masonryGammaMFromPreset,
  masonryKFromPreset,
  MASONRY_ANNEX_PRESETS,
  MASONRY_ENGINEER_CAUTION,
  normalisedStrength,
  verticalResistance,
} from '../calc/masonry'
import type { CharacteristicStrengthResult, NormalisedStrengthResult, VerticalResistanceResult } from '../calc/masonry'
import { characteristicStrengthInput, normalisedStrengthInput, verticalResistanceInput } from '../calc/schemas2'

const presetIds = MASONRY_ANNEX_PRESETS.map((p) => p.id) as [string, ...string[]]

const { fk: _fk, gammaM: _gammaM, ...wallShape } = verticalResistanceInput.shape

export const wallStrengthSchema = z
  .object({
    units: z.object(normalisedStrengthInput.shape, { error: 'Describe the units tested: mean strength, specimen size and conditioning' }),
    mortar: z.object({
      type: characteristicStrengthInput.shape.mortar,
      fm: characteristicStrengthInput.shape.fm,
    }, { error: 'Choose the mortar' }),
    annex: z.object({
      presetId: z.enum(presetIds, { error: `Choose a National Annex preset: ${presetIds.join(', ')}` }),
      unit: z.enum(['aggregate-concrete', 'autoclaved-aerated-concrete', 'calcium-silicate', 'clay'], { error: 'Choose the unit material' }),
      group: z.union([z.literal(1), z.literal(2)], { error: 'Unit group must be 1 or 2' }),
      unitCategory: z.enum(['I', 'II'], { error: 'Unit category must be I or II' }),
      executionClass: z.string({ error: 'Execution class must be text' }).trim().min(1, 'Choose the class of execution control').max(10),
      mortarSpec: z.enum(['designed', 'prescribed'], { error: "Mortar specification must be 'designed' or 'prescribed'" }).optional(),
      /** Values entered by hand replace the preset's, for an annex the product does not carry. */
      K: characteristicStrengthInput.shape.K.optional(),
      gammaM: verticalResistanceInput.shape.gammaM.optional(),
    }, { error: 'Choose the National Annex preset and describe the units' }),
    wall: z.object(wallShape, { error: 'Describe the wall: thickness, height, restraint and method' }),
  })
  .superRefine((v, ctx) => {
    if (v.mortar.type === 'general' && v.mortar.fm === undefined) {
      ctx.addIssue({ code: 'custom', message: 'fm is needed for general-purpose mortar', path: ['mortar', 'fm'] })
    }
    // The wall's own cross-field rules (eccentricities for Annex G, limits for the simplified method).
    const wall = verticalResistanceInput.safeParse({ ...v.wall, fk: 1, gammaM: 1.5 })
    if (!wall.success) for (const issue of wall.error.issues) ctx.addIssue({ code: 'custom', message: issue.message, path: ['wall', ...issue.path] })
  })
export type WallStrengthInput = z.infer<typeof wallStrengthSchema>

export interface WallStrengthResult {
  units: NormalisedStrengthResult
  K: { value: number, from: 'preset' | 'hand', source: string, caveat?: string, condition?: string }
  gammaM: { value: number, from: 'preset' | 'hand', source: string }
  preset: { id: string, label: string, status: 'recommended' | 'recalled', note: string }
  strength: CharacteristicStrengthResult
  resistance: VerticalResistanceResult
  caution: string
}

/**
 * Vertical resistance of a single-leaf wall from the test strength of its units — EN 772-1 Annex A (fb),
 * EN 1996-1-1 §3.6.1.2 (fk), §2.4.3 (γM) and §6.1.2 / Annex G or EN 1996-3 §4.2.2 (NRd).
 */
export function wallStrength(input: WallStrengthInput): WallStrengthResult {
  const preset = MASONRY_ANNEX_PRESETS.find((p) => p.id === input.annex.presetId)!
  const units = normalisedStrength(input.units)
  const K = input.annex.K !== undefined
    ? { value: input.annex.K, from: 'hand' as const, source: 'entered by hand' }
    : (() => {
        const k = masonryKFromPreset(preset.id, input.annex.unit, input.annex.group, input.mortar.type)
        return { value: k.K, from: 'preset' as const, source: k.source, caveat: k.caveat, condition: k.condition }
      })()
  const gammaM = input.annex.gammaM !== undefined
    ? { value: input.annex.gammaM, from: 'hand' as const, source: 'entered by hand' }
    : (() => {
        const g = masonryGammaMFromPreset(preset.id, input.annex.unitCategory, input.annex.executionClass, input.annex.mortarSpec)
        return { value: g.gammaM, from: 'preset' as const, source: g.source }
      })()
  const strength = characteristicStrength({ fb: units.fb, fm: input.mortar.fm, mortar: input.mortar.type, K: K.value })
  const resistance = verticalResistance({ ...input.wall, fk: strength.fk, gammaM: gammaM.value })
  return {
    units,
    K,
    gammaM,
    preset: { id: preset.id, label: preset.label, status: preset.status, note: preset.note },
    strength,
    resistance,
    caution: MASONRY_ENGINEER_CAUTION,
  }
}
