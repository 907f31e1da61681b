/**
 * The library's words and codes: collections, junction types, statuses and the code scheme, with their
 * labels. No zod here, so that the pages which only show these (the library, the detail sheet) do not
 * download a validator; the schemas that check front matter and route inputs build on this file.
 */

export const libraryCollections = ['details', 'clauses', 'guidance'] as const
export type LibraryCollection = (typeof libraryCollections)[number]

export const libraryCollectionLabels: Record<LibraryCollection, string> = {
  details: 'Junction details',
  clauses: 'Specification clauses',
  guidance: 'Guidance notes',
}

export const itemStatuses = ['current', 'superseded'] as const
export type ItemStatus = (typeof itemStatuses)[number]
export const itemStatusLabels: Record<ItemStatus, string> = { current: 'Current', superseded: 'Superseded' }

/** Junction types a detail can describe, in the order the library lists them. */
export const junctionTypes = [
  'ground-floor',
  'window-head',
  'window-jamb',
  'window-sill',
  'door-threshold',
  'eaves',
  'verge',
  'intermediate-floor',
  'party-wall',
  'external-corner',
  'internal-corner',
  'balcony',
  'service-penetration',
  'movement-joint',
  'plinth',
] as const

export type JunctionType = (typeof junctionTypes)[number]

/** Human labels for the junction types, as shown in filters and on detail sheets. */
export const junctionTypeLabels: Record<JunctionType, string> = {
  'ground-floor': 'Ground floor',
  'window-head': 'Window head',
  'window-jamb': 'Window jamb',
  'window-sill': 'Window sill',
  'door-threshold': 'Door threshold',
  'eaves': 'Eaves',
  'verge': 'Verge / gable',
  'intermediate-floor': 'Intermediate floor',
  'party-wall': 'Party wall',
  'external-corner': 'External corner',
  'internal-corner': 'Internal corner',
  'balcony': 'Balcony',
  'service-penetration': 'Service penetration',
  'movement-joint': 'Movement joint',
  'plinth': 'Plinth',
}

// Our own code scheme: a letter for the collection, an area or section word, a two-digit serial.
export const detailCodePattern = /^D-[A-Z]{2,6}-\d{2}$/
export const clauseCodePattern = /^C-[A-Z]{2,6}-\d{2}$/
export const guidanceCodePattern = /^G-[A-Z]{2,6}-\d{2}$/
export const anyCodePattern = /^[DCG]-[A-Z]{2,6}-\d{2}$/
