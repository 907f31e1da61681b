import { queryCollection } from '@nuxt/content/server'
import type { H3Event } from 'h3'
import { LibraryOverride } from '../models'
import type { RevisionEntry } from '../../shared/library/schemas'
import type { ItemStatus, JunctionType, LibraryCollection } from '../../shared/library/terms'
import { libraryCollections } from '../../shared/library/terms'
import { buildSearchIndex, rankSearch, searchPage } from '../../shared/library/search'
import type { EffectiveStatus, LibrarySearchFilters, LibrarySearchIndex, SearchDocument } from '../../shared/library/search'

/**
 * The detail library as the server holds it: the three content collections read once, on first use, and
 * kept for the life of the process with their MiniSearch index. Managers' status marks (library_overrides)
 * are read from MariaDB, cached briefly, and shown over the content's own status everywhere.
 */

interface LibraryEntry {
  collection: LibraryCollection
  code: string
  title: string
  revision: string
  revisionDate: string
  contentStatus: ItemStatus
  contentSupersededBy: string | null
  tags: string[]
  summary: string
  revisions: RevisionEntry[]
  related: string[]
  junctionType: JunctionType | null
  wallBuildUp: string | null
  psi: number | null
  fRsi: number | null
  modelledValuesNote: string | null
  drawing: string | null
  section: string | null
  body: unknown
  bodyText: string
}

interface Library {
  entries: Map<string, LibraryEntry>
  index: LibrarySearchIndex
}

/** One line of a result list. */
export interface LibrarySummary {
  code: string
  collection: LibraryCollection
  title: string
  revision: string
  revisionDate: string
  status: ItemStatus
  supersededBy: string | null
  junctionType: JunctionType | null
  section: string | null
  summary: string
}

export interface LibraryOverrideView {
  status: ItemStatus
  supersededBy: string | null
  setAt: string
}

/** An item page: everything on the sheet, its links resolved, its body as sanitised HTML. */
export interface LibraryItemView extends LibrarySummary {
  tags: string[]
  revisions: RevisionEntry[]
  related: LibrarySummary[]
  successor: LibrarySummary | null
  /** Items that name this one as their successor. */
  supersedes: LibrarySummary[]
  /** The content's own status, before any manager's mark. */
  contentStatus: ItemStatus
  override: LibraryOverrideView | null
  wallBuildUp: string | null
  psi: number | null
  fRsi: number | null
  modelledValuesNote: string | null
  drawingUrl: string | null
  drawing: string | null
  bodyHtml: string
  bodyText: string
}

let library: Promise<Library> | null = null

interface ContentRow {
  code: string
  title: string
  revision: string
  revisionDate: string
  status: ItemStatus
  supersededBy?: string | null
  tags: string[]
  summary: string
  revisions: RevisionEntry[]
  related?: string[]
  junctionType?: JunctionType
  wallBuildUp?: string
  psi?: number
  fRsi?: number
  modelledValuesNote?: string
  drawing?: string
  section?: string
  body: unknown
}

async function readCollection(event: H3Event, collection: LibraryCollection): Promise<LibraryEntry[]> {
  const rows = await queryCollection(event, collection).all() as unknown as ContentRow[]
  return rows.map(row => ({
    collection,
    code: row.code,
    title: row.title,
    revision: row.revision,
    revisionDate: row.revisionDate,
    contentStatus: row.status,
    contentSupersededBy: row.supersededBy ?? null,
    tags: row.tags ?? [],
    summary: row.summary,
    revisions: row.revisions ?? [],
    related: row.related ?? [],
    junctionType: row.junctionType ?? null,
    wallBuildUp: row.wallBuildUp ?? null,
    psi: row.psi ?? null,
    fRsi: row.fRsi ?? null,
    modelledValuesNote: row.modelledValuesNote ?? null,
    drawing: row.drawing ?? null,
    section: row.section ?? null,
    body: row.body,
    bodyText: minimarkToText(row.body),
  }))
}

function toDocument(entry: LibraryEntry): SearchDocument {
  return {
    code: entry.code,
    collection: entry.collection,
    title: entry.title,
    summary: entry.summary,
    tags: entry.tags.join(', '),
    body: [entry.section, entry.wallBuildUp, entry.bodyText].filter(Boolean).join('\n'),
    junctionType: entry.junctionType ?? undefined,
  }
}

/** The library, read and indexed on first use. A failed read is not cached, so the next request retries. */
export function useLibrary(event: H3Event): Promise<Library> {
  library ??= (async () => {
    const lists = await Promise.all(libraryCollections.map(c => readCollection(event, c)))
    const entries = new Map(lists.flat().map(e => [e.code, e]))
    return { entries, index: buildSearchIndex([...entries.values()].map(toDocument)) }
  })().catch((error) => {
    library = null
    throw error
  })
  return library
}

// Overrides are few and change rarely; a short cache keeps the search off the database. A write through
// this process clears it at once; another process sees the change within the TTL.
const OVERRIDE_TTL_MS = 5000
let overrides: { at: number, map: Map<string, LibraryOverride> } | null = null

async function currentOverrides(): Promise<Map<string, LibraryOverride>> {
  if (overrides && Date.now() - overrides.at < OVERRIDE_TTL_MS) return overrides.map
  try {
    useDb()
    const rows = await LibraryOverride.findAll()
    overrides = { at: Date.now(), map: new Map(rows.map(r => [r.code, r])) }
  }
  catch (error) {
    // The public library must stay up when MariaDB is not: show the content's own status meanwhile.
    console.error('library: could not read status overrides', error)
    overrides = { at: Date.now(), map: overrides?.map ?? new Map() }
  }
  return overrides.map
}

/** Drops the cached overrides, so the next read sees a mark just written. */
export function forgetLibraryOverrides() {
  overrides = null
}

function statusResolver(lib: Library, marks: Map<string, LibraryOverride>) {
  return (code: string): EffectiveStatus => {
    const mark = marks.get(code)
    if (mark) return { status: mark.status, supersededBy: mark.supersededBy }
    const entry = lib.entries.get(code)
    return { status: entry?.contentStatus ?? 'current', supersededBy: entry?.contentSupersededBy ?? null }
  }
}

function summarise(entry: LibraryEntry, statusOf: (code: string) => EffectiveStatus): LibrarySummary {
  const { status, supersededBy } = statusOf(entry.code)
  return {
    code: entry.code,
    collection: entry.collection,
    title: entry.title,
    revision: entry.revision,
    revisionDate: entry.revisionDate,
    status,
    supersededBy: status === 'superseded' ? supersededBy ?? null : null,
    junctionType: entry.junctionType,
    section: entry.section,
    summary: entry.summary,
  }
}

export interface LibrarySearchInput extends LibrarySearchFilters {
  q?: string
  limit?: number
}

/**
 * Searches the library (or, with no words, lists it in code order), filtered by collection, junction type
 * and status as it stands after managers' marks.
 */
export async function searchLibrary(event: H3Event, input: LibrarySearchInput): Promise<{ total: number, results: LibrarySummary[] }> {
  const lib = await useLibrary(event)
  const statusOf = statusResolver(lib, await currentOverrides())
  const limit = input.limit ?? 50
  const q = (input.q ?? '').trim()
  if (!q) {
    const all = [...lib.entries.values()]
      .filter(e => (!input.collection || e.collection === input.collection)
        && (!input.junctionType || e.junctionType === input.junctionType)
        && (!input.status || statusOf(e.code).status === input.status))
      .sort((a, b) => libraryCollections.indexOf(a.collection) - libraryCollections.indexOf(b.collection) || a.code.localeCompare(b.code))
    return { total: all.length, results: all.slice(0, limit).map(e => summarise(e, statusOf)) }
  }
  const { total, hits } = searchPage(lib.index, q, input, statusOf, limit)
  return { total, results: hits.map(h => summarise(lib.entries.get(h.code)!, statusOf)) }
}

/** The item with this code, as its page shows it; null when there is none. */
export async function getLibraryItem(event: H3Event, code: string): Promise<LibraryItemView | null> {
  const lib = await useLibrary(event)
  const marks = await currentOverrides()
  const statusOf = statusResolver(lib, marks)
  const entry = lib.entries.get(code)
  if (!entry) return null
  const summary = summarise(entry, statusOf)
  const mark = marks.get(code)
  const successorEntry = summary.supersededBy ? lib.entries.get(summary.supersededBy) : undefined
  return {
    ...summary,
    tags: entry.tags,
    revisions: entry.revisions,
    related: entry.related.flatMap(c => (lib.entries.has(c) ? [summarise(lib.entries.get(c)!, statusOf)] : [])),
    successor: successorEntry ? summarise(successorEntry, statusOf) : null,
    supersedes: [...lib.entries.values()]
      .filter(e => e.code !== code && statusOf(e.code).status === 'superseded' && statusOf(e.code).supersededBy === code)
      .map(e => summarise(e, statusOf)),
    contentStatus: entry.contentStatus,
    override: mark ? { status: mark.status, supersededBy: mark.supersededBy, setAt: mark.setAt.toISOString() } : null,
    wallBuildUp: entry.wallBuildUp,
    psi: entry.psi,
    fRsi: entry.fRsi,
    modelledValuesNote: entry.modelledValuesNote,
    drawing: entry.drawing,
    drawingUrl: entry.drawing ? `/library/drawings/${entry.drawing}` : null,
    bodyHtml: minimarkToHtml(entry.body, new Set(lib.entries.keys())),
    bodyText: entry.bodyText,
  }
}

/** The parsed body blocks of an item, for the PDF sheet. */
export async function getLibraryBlocks(event: H3Event, code: string): Promise<TextBlock[]> {
  const entry = (await useLibrary(event)).entries.get(code)
  return entry ? minimarkToBlocks(entry.body) : []
}

// Words that carry no subject in an enquiry's free text; without them a long question does not match
// every item through "the" and "with".
const stopWords = new Set(('the and for with this that from have has are was were our your you what which when where how '
  + 'can could would should will not but any all into onto over under about there their they them then than also '
  + 'please thanks thank regards dear hello need needs want like use used using on in at of to by or is it be as an '
  + 'we us my me do does if so').split(' '))

/**
 * Current details and clauses most likely to answer a free text (an enquiry's topic, question and project),
 * best first. Words only: no prefix matching, fuzzy for long words, so a long question stays precise.
 */
export async function suggestForText(event: H3Event, text: string, limit = 8): Promise<LibrarySummary[]> {
  const lib = await useLibrary(event)
  const statusOf = statusResolver(lib, await currentOverrides())
  const words = [...new Set(text.toLowerCase().split(/[^\p{L}\p{N}-]+/u).filter(w => w.length > 2 && !stopWords.has(w)))].slice(0, 200)
  if (!words.length) return []
  const hits = rankSearch(lib.index, words.join(' '), { status: 'current' }, statusOf, Number.MAX_SAFE_INTEGER, {
    prefix: false,
    fuzzy: term => (term.length >= 6 && !/\d/.test(term) && !lib.index.vocabulary.has(term) ? 0.15 : false),
  })
  return hits
    .map(h => lib.entries.get(h.code)!)
    .filter(e => e.collection !== 'guidance')
    .slice(0, limit)
    .map(e => summarise(e, statusOf))
}

/** Writes (or, with `successor: null`, removes) a manager's mark over an item's status. */
export async function setLibraryOverride(code: string, successor: string | null, userId: number): Promise<void> {
  useDb()
  if (successor === null) await LibraryOverride.destroy({ where: { code } })
  else await LibraryOverride.upsert({ code, status: 'superseded', supersededBy: successor, setBy: userId, setAt: new Date() })
  forgetLibraryOverrides()
}
