import { existsSync, readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { parse } from 'yaml'
import { XMLValidator } from 'fast-xml-parser'
import { clauseSchema, detailSchema, guidanceSchema } from '../../shared/library/schemas'
import { junctionTypeLabels, junctionTypes } from '../../shared/library/terms'

// Walks the whole detail library: every item against its collection schema, the links between
// items, and every drawing as well-formed, self-contained, printable SVG.

const root = fileURLToPath(new URL('../../', import.meta.url))
const drawingsDir = join(root, 'public', 'library', 'drawings')

const collections = {
  details: { dir: join(root, 'content', 'details'), schema: detailSchema, min: 24 },
  clauses: { dir: join(root, 'content', 'clauses'), schema: clauseSchema, min: 40 },
  guidance: { dir: join(root, 'content', 'guidance'), schema: guidanceSchema, min: 10 },
} as const
type CollectionName = keyof typeof collections

interface Item {
  collection: CollectionName
  file: string
  data: Record<string, unknown>
  body: string
}

/** Splits a markdown file into its YAML front matter and body; throws when the fence is missing. */
function splitFrontMatter(text: string, file: string): { data: Record<string, unknown>, body: string } {
  const m = /^---\r?\n([\s\S]*?)\r?\n---\r?\n?([\s\S]*)$/.exec(text)
  if (!m) throw new Error(`${file}: no front matter fence`)
  const data = parse(m[1]!) as unknown
  if (typeof data !== 'object' || data === null || Array.isArray(data)) throw new Error(`${file}: front matter is not a mapping`)
  return { data: data as Record<string, unknown>, body: m[2]! }
}

/** Body text as one line: blockquote markers dropped and line breaks folded, so phrases wrapped across lines match. */
function prose(body: string): string {
  return body.replace(/^\s*>\s?/gm, '').replace(/\s+/g, ' ')
}

function load(): Item[] {
  const items: Item[] = []
  for (const [collection, { dir }] of Object.entries(collections) as [CollectionName, (typeof collections)[CollectionName]][]) {
    for (const file of readdirSync(dir).filter(n => n.endsWith('.md')).sort()) {
      const { data, body } = splitFrontMatter(readFileSync(join(dir, file), 'utf8'), file)
      items.push({ collection, file, data, body })
    }
  }
  return items
}

const items = load()
const byCode = new Map(items.map(i => [String(i.data.code), i]))
const rows = items.map(i => [`${i.collection}/${i.file}`, i] as const)
const details = items.filter(i => i.collection === 'details')
const detailRows = details.map(i => [i.file, i] as const)

describe('library content: counts and coverage', () => {
  it.each(Object.entries(collections).map(([name, c]) => [name, c.min] as const))(
    '%s has at least %i items',
    (name, min) => {
      expect(items.filter(i => i.collection === name).length).toBeGreaterThanOrEqual(min)
    },
  )

  it.each(junctionTypes.map(t => [t]))('junction type %s is covered by a current detail', (type) => {
    expect(details.some(d => d.data.junctionType === type && d.data.status === 'current')).toBe(true)
  })

  it('every junction type has a label', () => {
    expect(Object.keys(junctionTypeLabels).sort()).toEqual([...junctionTypes].sort())
  })

  it('codes are unique across the library', () => {
    const codes = items.map(i => String(i.data.code))
    const dupes = codes.filter((c, k) => codes.indexOf(c) !== k)
    expect(dupes).toEqual([])
  })

  it.each(['details', 'clauses'] as const)('%s include a superseded item with a successor', (name) => {
    expect(items.some(i => i.collection === name && i.data.status === 'superseded')).toBe(true)
  })
})

describe('library content: each item', () => {
  it.each(rows)('%s passes its collection schema', (_name, item) => {
    const result = collections[item.collection].schema.safeParse(item.data)
    const problems = result.success ? [] : result.error.issues.map(x => `${x.path.join('.')}: ${x.message}`)
    expect(problems).toEqual([])
  })

  it.each(rows)('%s is stored under its own code', (_name, item) => {
    expect(item.file).toBe(`${String(item.data.code)}.md`)
  })

  it.each(rows)('%s links only to items that exist', (_name, item) => {
    const links = [...((item.data.related as string[] | undefined) ?? [])]
    if (item.data.supersededBy) links.push(String(item.data.supersededBy))
    expect(links.filter(code => !byCode.has(code))).toEqual([])
  })

  it.each(rows)('%s has a body of real text', (_name, item) => {
    expect(item.body.trim().split(/\s+/).length).toBeGreaterThan(50)
  })

  it.each(rows)('%s names no successor that is itself superseded, and the successor is newer', (_name, item) => {
    if (item.data.status !== 'superseded') return
    const next = byCode.get(String(item.data.supersededBy))
    expect(next?.collection).toBe(item.collection)
    expect(next?.data.status).toBe('current')
    expect(String(next?.data.revision) > String(item.data.revision)).toBe(true)
    const firstOfNext = (next?.data.revisions as { date: string }[])[0]!.date
    expect(firstOfNext >= String(item.data.revisionDate)).toBe(true)
  })

  it.each(rows)('%s carries the engineer caution where it is about fire', (_name, item) => {
    const subject = `${String(item.data.title)} ${(item.data.tags as string[]).join(' ')}`
    if (!/fire/i.test(subject)) return
    const text = prose(item.body)
    expect(text).toMatch(/fire engineer/i)
    // the library never states that a build-up passes the rules
    expect(text).not.toMatch(/\b(passes|meets|satisfies|complies with)\s+(the\s+)?(fire\s+)?(building\s+)?(regulations?|requirements)\b/i)
  })
})

describe('library content: details', () => {
  it.each(detailRows)('%s has the sections a site team needs', (_name, item) => {
    for (const heading of ['## Description', '## Key points for site', '## Air barrier line', '## Thermal notes', '## Demo values']) {
      expect(item.body).toContain(heading)
    }
    expect(item.body).toMatch(/invented demo values/i)
  })

  it.each(detailRows)('%s has a drawing that is well-formed, self-contained SVG', (_name, item) => {
    const file = join(drawingsDir, String(item.data.drawing))
    expect(existsSync(file)).toBe(true)
    const svg = readFileSync(file, 'utf8')
    expect(XMLValidator.validate(svg)).toBe(true)
    expect(svg).toMatch(/<svg[^>]*\sviewBox="0 0 \d+ \d+"/)
    expect(svg).not.toMatch(/<script|\son\w+="|<foreignObject|<image/i)
    // nothing fetched from outside: only local fragment references
    expect(svg.match(/(?:href|src)="(?!#)[^"]*"/g) ?? []).toEqual([])
    expect(svg).not.toMatch(/url\((?!#)/)
    expect(svg).not.toMatch(/@import|@font-face/)
    expect(svg).toContain('<pattern')
    expect(svg).toContain('Demo drawing — invented')
  })

  it.each(detailRows)('%s drawing title block shows the code and the current revision', (_name, item) => {
    const svg = readFileSync(join(drawingsDir, String(item.data.drawing)), 'utf8')
    expect(svg).toContain(`>${String(item.data.code)}</text>`)
    expect(svg).toContain(`>${String(item.data.revision)}</text>`)
    expect(svg).toContain(`>${String(item.data.revisionDate)}</text>`)
  })
})
