import type { H3Event } from 'h3'
import { QueryTypes } from 'sequelize'
import type { PinnedItem } from '../models/response-pack'
import type { LibrarySummary } from './library-index'

/**
 * Library items a pack sent that the library has moved on from since: superseded (by the content or a
 * manager's mark) or issued at a later revision. What was sent stays as it was; the officer decides whether
 * the requester needs the next revision of the pack.
 */
export interface StaleItem {
  enquiryRef: string
  packRevision: string
  code: string
  title: string
  sentRevision: string
  change: 'superseded' | 'revised'
  currentRevision: string | null
  supersededBy: string | null
}

interface SentPack { enquiryRef: string, packRevision: string, items: PinnedItem[] }

async function libraryByCode(event: H3Event): Promise<Map<string, LibrarySummary>> {
  const { results } = await searchLibrary(event, { limit: Number.MAX_SAFE_INTEGER })
  return new Map(results.map(r => [r.code, r]))
}

function staleIn(packs: SentPack[], library: Map<string, LibrarySummary>): StaleItem[] {
  const stale: StaleItem[] = []
  for (const pack of packs) {
    for (const item of pack.items) {
      const now = library.get(item.code)
      const change = !now || now.status === 'superseded' ? 'superseded' : now.revision !== item.revision ? 'revised' : null
      if (!change) continue
      stale.push({
        enquiryRef: pack.enquiryRef, packRevision: pack.packRevision, code: item.code, title: item.title, sentRevision: item.revision,
        change, currentRevision: now?.revision ?? null, supersededBy: now?.supersededBy ?? null,
      })
    }
  }
  return stale
}

/** Stale items in the issued packs of one enquiry. */
export async function staleItemsOfEnquiry(event: H3Event, enquiryId: number, enquiryRef: string): Promise<StaleItem[]> {
  const rows = await useDb().query<{ revision: string, items: string }>(
    `SELECT revision, items FROM response_packs WHERE enquiry_id = :enquiryId AND status = 'issued' ORDER BY revision`,
    { replacements: { enquiryId }, type: QueryTypes.SELECT },
  )
  if (!rows.length) return []
  return staleIn(rows.map(r => ({ enquiryRef, packRevision: r.revision, items: JSON.parse(r.items) as PinnedItem[] })), await libraryByCode(event))
}

/**
 * Stale items across the enquiries still open (not closed, not merged), newest pack first. It reads the item
 * lists of issued packs only (a few thousand a year, against a library of about a hundred items).
 */
export async function staleItemsOnOpenEnquiries(event: H3Event, limit = 200): Promise<StaleItem[]> {
  const rows = await useDb().query<{ ref: string, revision: string, items: string }>(
    `SELECT e.ref, p.revision, p.items
       FROM response_packs p JOIN enquiries e ON e.id = p.enquiry_id
      WHERE p.status = 'issued' AND e.status <> 'closed' AND e.merged_into_id IS NULL AND p.items <> '[]'
      ORDER BY p.issued_at DESC, p.id DESC`,
    { type: QueryTypes.SELECT },
  )
  if (!rows.length) return []
  const stale = staleIn(rows.map(r => ({ enquiryRef: r.ref, packRevision: r.revision, items: JSON.parse(r.items) as PinnedItem[] })), await libraryByCode(event))
  return stale.slice(0, limit)
}
