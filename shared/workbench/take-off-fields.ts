/**
 * The wall take-off inputs that the quantities page and the quotation builder both ask for, in one place:
 * key in the form, label, unit, and where the field sits in the wallQuantities input (for error messages).
 */
export const takeOffFields = [
  { key: 'area_m2', label: 'Gross wall area', unit: 'm²', path: 'area_m2' },
  { key: 'openings_m2', label: 'Openings area', unit: 'm²', path: 'openings_m2' },
  { key: 'baseLength_m', label: 'Wall length at the base', unit: 'm', path: 'baseLength_m' },
  { key: 'openingsCount', label: 'Number of openings', unit: undefined, path: 'openingsCount' },
  { key: 'openingsPerimeter_m', label: 'Openings perimeter', unit: 'm', path: 'openingsPerimeter_m' },
  { key: 'openingHeads_m', label: 'Opening heads', unit: 'm', path: 'openingHeads_m' },
  { key: 'externalCorners_m', label: 'External corners', unit: 'm', path: 'externalCorners_m' },
  { key: 'anchorsPerM2', label: 'Anchors per m² (from the wind page)', unit: '/m²', path: 'anchorsPerM2' },
  { key: 'length_mm', label: 'Unit length', unit: 'mm', path: 'system.block.length_mm' },
  { key: 'height_mm', label: 'Unit height', unit: 'mm', path: 'system.block.height_mm' },
  { key: 'thickness_mm', label: 'Unit thickness', unit: 'mm', path: 'system.block.thickness_mm' },
] as const

export type TakeOffKey = typeof takeOffFields[number]['key']
