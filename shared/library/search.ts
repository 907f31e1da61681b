import MiniSearch from 'minisearch'
import type { Options, SearchOptions, SearchResult } from 'minisearch'
import { anyCodePattern } from './terms'
import type { ItemStatus, JunctionType, LibraryCollection } from './terms'

/**
 * The library's search, shared by the server's index (server/utils/library-index.ts) and the bench, so the
 * figures the bench reports are those of the options the server really runs.
 */

/** One library item as the index sees it: the text fields it searches and the few it filters on. */
export interface SearchDocument {
  code: string
  collection: LibraryCollection
  title: string
  summary: string
  /** The item's tags joined with commas. */
  tags: string
  /** The body as plain text. */
  body: string
  junctionType?: JunctionType
}

/** Status as it stands now: the content's own, or a manager's override over it. */
export interface EffectiveStatus {
  status: ItemStatus
  supersededBy?: string | null
}

export interface LibrarySearchFilters {
  collection?: LibraryCollection
  junctionType?: JunctionType
  status?: ItemStatus
}

export interface RankedHit {
  code: string
  score: number
  /** The query was this item's code, written out in full. */
  exactCode: boolean
}

const searchFields = ['code', 'title', 'tags', 'summary', 'body'] as const

/** Code ≫ title > tags > summary > body: a code typed in full must beat any number of words in the text. */
export const fieldBoosts: Record<(typeof searchFields)[number], number> = { code: 12, title: 4, tags: 3, summary: 2, body: 1 }

/**
 * How much a superseded item's score is multiplied by. Low enough that it sinks below current items that
 * match as well, not so low that it disappears from a search for its own words.
 */
export const supersededFactor = 0.35

const codeLike = /^[a-z]-[a-z]{2,6}(-\d{0,2})?$/

/**
 * Splits text into words, keeping hyphenated words (and our codes) whole as well as in their parts, so that
 * "D-WIN-03" is found as one term, "D-WIN" finds every window detail by prefix, and "ground-bearing" finds
 * both "ground" and "bearing". The single letter and the serial of a code are dropped as parts: "d" or "03"
 * would match half the library.
 */
export function tokenize(text: string): string[] {
  const tokens: string[] = []
  for (const word of text.split(/[^\p{L}\p{N}-]+/u)) {
    const trimmed = word.replace(/^-+|-+$/g, '')
    if (!trimmed) continue
    tokens.push(trimmed)
    if (!trimmed.includes('-')) continue
    const isCode = codeLike.test(trimmed.toLowerCase())
    for (const part of trimmed.split('-')) {
      if (!part) continue
      if (isCode && (part.length < 2 || /^\d+$/.test(part))) continue
      tokens.push(part)
    }
  }
  return tokens
}

// Words that say nothing about a subject. Left in, each would match every item and, as a prefix, hundreds of
// words besides; taken out, a long query costs little more than its subject words.
const stopWords = new Set(('a an and are as at be by for from has have in into is it its of on onto or that the their '
  + 'then there these this to was were which with').split(' '))

/** Lower-case; drops stop words and one-character words other than digits (they carry no meaning in a search). */
export function processTerm(term: string): string | null {
  const t = term.toLowerCase()
  if (t.length < 2 && !/\d/.test(t)) return null
  if (stopWords.has(t)) return null
  return t
}

/**
 * Fuzzy matching (edit distance up to 0.2 of the term) for misspelt words only: never for codes (D-WIN-03 is
 * not D-WIN-02), nor for a word the library contains as typed — fuzzing "window" into "widow" adds noise and,
 * in a large library, most of the time a query takes.
 */
function fuzzyFor(term: string, vocabulary?: ReadonlySet<string>): number | false {
  if (codeLike.test(term) || /\d/.test(term) || term.length < 4) return false
  if (vocabulary?.has(term)) return false
  return 0.2
}

export const defaultSearchOptions: SearchOptions = {
  boost: fieldBoosts,
  // Only the last word is still being typed; earlier words are whole, so matching them as prefixes only
  // adds noise (and, in a large library, most of the time a query takes).
  prefix: (term, i, terms) => i === terms.length - 1 && term.length >= 2,
  fuzzy: term => fuzzyFor(term),
  combineWith: 'OR',
}

/** The MiniSearch options of the library index. The bench builds its synthetic library with these too. */
export const miniSearchOptions: Options<SearchDocument> = {
  idField: 'code',
  fields: [...searchFields],
  storeFields: ['collection', 'junctionType'],
  tokenize,
  processTerm,
  searchOptions: defaultSearchOptions,
}

/** The MiniSearch index with the set of terms it holds (to tell a misspelling from a word). */
export interface LibrarySearchIndex {
  miniSearch: MiniSearch<SearchDocument>
  vocabulary: Set<string>
}

export function buildSearchIndex(documents: SearchDocument[]): LibrarySearchIndex {
  const miniSearch = new MiniSearch<SearchDocument>(miniSearchOptions)
  miniSearch.addAll(documents)
  const vocabulary = new Set<string>()
  for (const doc of documents) {
    for (const field of searchFields) {
      for (const token of tokenize(String(doc[field]))) {
        const term = processTerm(token)
        if (term) vocabulary.add(term)
      }
    }
  }
  return { miniSearch, vocabulary }
}

/**
 * Runs a query over the index: filters on collection, junction type and (effective) status, demotes
 * superseded items, and keeps each superseded item below its successor when both are found. An item whose
 * code is the whole query stays first — whoever types a code in full wants that sheet, superseded or not.
 * Answers the number of items found and the best `limit` of them.
 */
export function searchPage(
  index: LibrarySearchIndex,
  query: string,
  filters: LibrarySearchFilters,
  statusOf: (code: string) => EffectiveStatus,
  limit: number,
  extra: SearchOptions = {},
): { total: number, hits: RankedHit[] } {
  const q = query.trim()
  if (!q) return { total: 0, hits: [] }
  const exact = anyCodePattern.test(q.toUpperCase()) ? q.toUpperCase() : null
  const results: SearchResult[] = index.miniSearch.search(q, {
    fuzzy: term => fuzzyFor(term, index.vocabulary),
    ...extra,
    filter: (r) => {
      if (filters.collection && r.collection !== filters.collection) return false
      if (filters.junctionType && r.junctionType !== filters.junctionType) return false
      if (filters.status && statusOf(String(r.id)).status !== filters.status) return false
      return true
    },
  })
  // The superseded factor is applied to the item's total rather than, through MiniSearch's boostDocument,
  // to every word and field it matched: the same product (the factor does not depend on the word), without
  // a call per posting — most of what a common word costs in a large library.
  const hits: RankedHit[] = []
  const superseded: { hit: RankedHit, successor: string }[] = []
  for (const r of results) {
    const code = String(r.id)
    const { status, supersededBy } = statusOf(code)
    const hit = { code, score: status === 'superseded' ? r.score * supersededFactor : r.score, exactCode: code === exact }
    hits.push(hit)
    if (status === 'superseded' && supersededBy && !hit.exactCode) superseded.push({ hit, successor: supersededBy })
  }

  // Each superseded item is held just under its successor's final score, when both are found.
  if (superseded.length) {
    const wanted = new Set(superseded.map(s => s.successor))
    const successors = new Map(hits.filter(h => wanted.has(h.code)).map(h => [h.code, h]))
    for (const { hit, successor } of superseded) {
      const next = successors.get(successor)
      if (next && next.score <= hit.score) hit.score = next.score * 0.999
    }
  }
  return { total: hits.length, hits: bestFirst(hits, limit) }
}

const ranking = (a: RankedHit, b: RankedHit) => Number(b.exactCode) - Number(a.exactCode) || b.score - a.score || a.code.localeCompare(b.code)

/**
 * The best `limit` hits in ranking order. A search-as-you-type page shows a few dozen of the thousands a
 * common word finds: keep a sorted page and let through only what beats its last, instead of sorting all.
 */
function bestFirst(hits: RankedHit[], limit: number): RankedHit[] {
  if (hits.length <= limit * 4) return hits.sort(ranking).slice(0, limit)
  const page: RankedHit[] = []
  for (const h of hits) {
    if (page.length === limit && ranking(h, page[limit - 1]!) >= 0) continue
    let at = page.length
    while (at > 0 && ranking(h, page[at - 1]!) < 0) at--
    page.splice(at, 0, h)
    if (page.length > limit) page.pop()
  }
  return page
}

/** {@link searchPage}'s hits alone. */
export function rankSearch(
  index: LibrarySearchIndex,
  query: string,
  filters: LibrarySearchFilters,
  statusOf: (code: string) => EffectiveStatus,
  limit: number,
  extra: SearchOptions = {},
): RankedHit[] {
  return searchPage(index, query, filters, statusOf, limit, extra).hits
}
