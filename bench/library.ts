/**
 * Search latency of the detail library: p50/p95 over a mix of queries (codes, code prefixes, words,
 * misspellings, filtered searches), on the real library and on a synthetic library of 5,000 items, with the
 * size of each serialised index. Uses the very options and ranking the server runs (shared/library/search.ts).
 * Run with `npx tsx bench/library.ts`. Goal: p95 under 5 ms at 5,000 items.
 */
import { readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { gzipSync } from 'node:zlib'
import { marked } from 'marked'
import { parse } from 'yaml'
import { junctionTypes } from '../shared/library/terms'
import type { ItemStatus, JunctionType, LibraryCollection } from '../shared/library/terms'
import { buildSearchIndex, searchPage } from '../shared/library/search'
import type { EffectiveStatus, LibrarySearchFilters, SearchDocument } from '../shared/library/search'

const root = fileURLToPath(new URL('..', import.meta.url))

interface Library {
  docs: SearchDocument[]
  status: Map<string, EffectiveStatus>
}

/** Markdown to the plain text the server indexes (it reads the parsed body; here the file is parsed). */
function plainText(markdown: string): string {
  const html = marked.parse(markdown, { async: false })
  return html.replace(/<[^>]+>/g, ' ').replace(/&[a-z#0-9]+;/gi, ' ').replace(/\s+/g, ' ').trim()
}

function loadRealLibrary(): Library {
  const docs: SearchDocument[] = []
  const status = new Map<string, EffectiveStatus>()
  for (const collection of ['details', 'clauses', 'guidance'] as LibraryCollection[]) {
    const dir = join(root, 'content', collection)
    for (const file of readdirSync(dir).filter(f => f.endsWith('.md'))) {
      const m = /^---\r?\n([\s\S]*?)\r?\n---\r?\n?([\s\S]*)$/.exec(readFileSync(join(dir, file), 'utf8'))
      if (!m) throw new Error(`${file}: no front matter`)
      const data = parse(m[1]!) as Record<string, unknown>
      const code = String(data.code)
      docs.push({
        code,
        collection,
        title: String(data.title),
        summary: String(data.summary),
        tags: (data.tags as string[]).join(', '),
        body: [data.section, data.wallBuildUp, plainText(m[2]!)].filter(Boolean).join('\n'),
        junctionType: data.junctionType as JunctionType | undefined,
      })
      status.set(code, { status: data.status as ItemStatus, supersededBy: (data.supersededBy as string | undefined) ?? null })
    }
  }
  return { docs, status }
}

/** A deterministic pseudo-random sequence (mulberry32), so every run benches the same synthetic library. */
function random(seed: number) {
  let a = seed
  return () => {
    a = (a + 0x6D2B79F5) | 0
    let t = Math.imul(a ^ (a >>> 15), 1 | a)
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

/**
 * 5,000 items grown from the real library: each is a variant of a real item (its sentences reordered, a tenth
 * of its words swapped for words from elsewhere in the library, a code of its own), so the synthetic library
 * keeps the real one's subjects and word frequencies — window words cluster in window items — at 60 times the size.
 */
function syntheticLibrary(real: Library, size: number): Library {
  const rnd = random(6)
  const pick = <T>(list: readonly T[]) => list[Math.floor(rnd() * list.length)]!
  const words = real.docs.flatMap(d => `${d.title} ${d.summary} ${d.body}`.toLowerCase().match(/\p{L}{2,}/gu) ?? [])
  const vary = (text: string) => text.split(' ').map(w => (rnd() < 0.1 ? pick(words) : w)).join(' ')
  const shuffle = <T>(list: T[]) => {
    for (let i = list.length - 1; i > 0; i--) {
      const j = Math.floor(rnd() * (i + 1));
      [list[i], list[j]] = [list[j]!, list[i]!]
    }
    return list
  }
  const letters = 'ABCDEFGHIJKLMNOPQRSTUVWXYZ'
  const docs: SearchDocument[] = []
  const status = new Map<string, EffectiveStatus>()
  const seen = new Set<string>()
  while (docs.length < size) {
    const base = pick(real.docs)
    const area = Array.from({ length: 3 + Math.floor(rnd() * 3) }, () => pick([...letters])).join('')
    const code = `${base.code[0]}-${area}-${String(Math.floor(rnd() * 100)).padStart(2, '0')}`
    if (seen.has(code)) continue
    seen.add(code)
    docs.push({
      code,
      collection: base.collection,
      title: vary(base.title),
      summary: vary(base.summary),
      tags: base.tags,
      body: vary(shuffle(base.body.split(/(?<=\.)\s+/)).join(' ')),
      junctionType: base.junctionType ?? (base.collection === 'details' ? pick(junctionTypes) : undefined),
    })
    status.set(code, { status: rnd() < 0.1 ? 'superseded' : 'current', supersededBy: null })
  }
  // Point each superseded item at a current one of its kind, as a real library would.
  const current = docs.filter(d => status.get(d.code)!.status === 'current')
  for (const d of docs) {
    const s = status.get(d.code)!
    if (s.status === 'superseded') s.supersededBy = current.find(c => c.collection === d.collection)?.code ?? null
  }
  return { docs, status }
}

interface BenchQuery { q: string, filters?: LibrarySearchFilters }

function queriesFor(lib: Library): BenchQuery[] {
  const someCodes = lib.docs.filter((_, i) => i % Math.max(1, Math.floor(lib.docs.length / 8)) === 0).map(d => d.code)
  return [
    ...someCodes.map(code => ({ q: code })),
    ...someCodes.map(code => ({ q: code.slice(0, code.lastIndexOf('-')) })),
    { q: 'window head' }, { q: 'fire barrier floor' }, { q: 'mesh laps' }, { q: 'mortr' }, { q: 'insulaton boards' },
    { q: 'threshol' }, { q: 'air barrier continuity at the window' }, { q: 'anchors' }, { q: 'cold weather curing' },
    { q: 'render', filters: { collection: 'clauses' } },
    { q: 'insulation', filters: { collection: 'details', junctionType: 'window-head' } },
    { q: 'slab', filters: { status: 'current' } },
    { q: 'movement joint sealant backing rod' }, { q: 'chasing services in blockwork' },
  ]
}

function percentile(sorted: number[], q: number): number {
  return sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))]!
}

function bench(label: string, lib: Library, rounds: number) {
  const t0 = performance.now()
  const index = buildSearchIndex(lib.docs)
  const buildMs = performance.now() - t0
  const statusOf = (code: string) => lib.status.get(code) ?? { status: 'current' as const }
  const queries = queriesFor(lib)
  for (const { q, filters } of queries) searchPage(index, q, filters ?? {}, statusOf, 50) // warm-up

  const times: number[] = []
  let hits = 0
  for (let r = 0; r < rounds; r++) {
    for (const { q, filters } of queries) {
      const start = performance.now()
      hits += searchPage(index, q, filters ?? {}, statusOf, 50).hits.length
      times.push(performance.now() - start)
    }
  }
  times.sort((a, b) => a - b)
  const payload = JSON.stringify(index.miniSearch)
  const kb = (n: number) => `${(n / 1024).toFixed(0)} KiB`
  console.log(`${label}: ${lib.docs.length} items, index built in ${buildMs.toFixed(0)} ms`)
  console.log(`  search: ${times.length} queries (${queries.length} kinds × ${rounds}), p50 ${percentile(times, 0.5).toFixed(3)} ms, p95 ${percentile(times, 0.95).toFixed(3)} ms, max ${times.at(-1)!.toFixed(3)} ms, mean hits ${(hits / times.length).toFixed(1)}`)
  console.log(`  index payload (MiniSearch JSON): ${kb(Buffer.byteLength(payload))}, gzip ${kb(gzipSync(payload).length)}`)
  return percentile(times, 0.95)
}

const real = loadRealLibrary()
bench('Real library', real, 200)
const p95 = bench('Synthetic library', syntheticLibrary(real, 5000), 20)
console.log(p95 < 5 ? `Goal met: p95 ${p95.toFixed(2)} ms < 5 ms at 5,000 items.` : `Goal missed: p95 ${p95.toFixed(2)} ms ≥ 5 ms at 5,000 items.`)
