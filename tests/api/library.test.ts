import { fetch } from '@nuxt/test-utils/e2e'
import { QueryTypes } from 'sequelize'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { XMLValidator } from 'fast-xml-parser'
import { call, demo, signIn } from '../support/api'
import { closeTestDb, testDb } from '../support/db'
import { useBuiltServer } from '../support/server'
import { pdfText } from '../support/pdf'

interface Summary { code: string, collection: string, title: string, status: string, supersededBy: string | null, junctionType: string | null }

const codes = (results: Summary[]) => results.map(r => r.code)
const search = async (query: string) => (await call<{ total: number, results: Summary[] }>(`/api/library/search?${query}`)).body

describe('detail library API', async () => {
  await useBuiltServer()
  let manager: string
  let officer: string
  // The item the supersede tests mark; its mark is taken away again afterwards.
  const marked = 'G-SITE-02'
  const successor = 'G-SITE-01'

  beforeAll(async () => {
    manager = await signIn(demo.manager)
    officer = await signIn(demo.officer)
  })
  afterAll(async () => {
    await testDb().query('DELETE FROM library_overrides WHERE code = ?', { replacements: [marked], type: QueryTypes.DELETE })
    await closeTestDb()
  })

  describe('search', () => {
    it.each([
      // exact code, any case: that item first
      { label: 'exact code', query: 'q=D-WIN-03', first: 'D-WIN-03' },
      { label: 'exact code in lower case', query: 'q=c-etics-01', first: 'C-ETICS-01' },
      // a misspelt word still finds the items about it
      { label: 'misspelt word "mortr"', query: 'q=mortr', firstIn: ['C-MOR-01', 'C-MOR-02', 'C-MOR-03', 'C-MOR-04', 'C-MOR-06'] },
      { label: 'misspelt word "balconny"', query: 'q=balconny', first: 'D-BAL-01' },
    ])('$label', async ({ query, first, firstIn }) => {
      const body = await search(query)
      expect(body.total).toBeGreaterThan(0)
      if (first) expect(body.results[0]!.code).toBe(first)
      if (firstIn) expect(firstIn).toContain(body.results[0]!.code)
    })

    it('finds every window detail by the prefix of their code, and only details lead', async () => {
      const body = await search('q=D-WIN&limit=6')
      expect(codes(body.results).sort()).toEqual(['D-WIN-01', 'D-WIN-02', 'D-WIN-03', 'D-WIN-04', 'D-WIN-05', 'D-WIN-06'])
    })

    it('finds words by their beginning ("threshol" finds the door threshold detail)', async () => {
      const body = await search('q=threshol')
      expect(codes(body.results)).toContain('D-DOR-01')
      expect(body.results[0]!.code).toBe('D-DOR-01')
    })

    it.each([
      { filter: 'collection=clauses', check: (r: Summary) => r.collection === 'clauses' },
      { filter: 'collection=details&junctionType=window-head', check: (r: Summary) => r.junctionType === 'window-head' },
      { filter: 'status=superseded', check: (r: Summary) => r.status === 'superseded' },
    ])('filters with $filter, with and without words', async ({ filter, check }) => {
      for (const q of ['', 'q=render']) {
        const body = await search(`${q}&${filter}&limit=200`)
        expect(body.results.every(check), `${q} ${filter}`).toBe(true)
        if (!q) expect(body.total).toBeGreaterThan(0)
      }
      const windowHeads = await search('junctionType=window-head&limit=200')
      expect(codes(windowHeads.results)).toContain('D-WIN-01')
      const superseded = await search('status=superseded&limit=200')
      expect(codes(superseded.results)).toEqual(expect.arrayContaining(['D-GRD-01', 'C-MOR-05']))
    })

    it.each([
      { q: 'ground-bearing slab insulation', old: 'D-GRD-01', next: 'D-GRD-03' },
      { q: 'mortar', old: 'C-MOR-05', next: 'C-MOR-06' },
    ])('ranks superseded $old below its successor $next for "$q"', async ({ q, old, next }) => {
      const list = codes((await search(`q=${encodeURIComponent(q)}&limit=200`)).results)
      expect(list).toContain(old)
      expect(list).toContain(next)
      expect(list.indexOf(next)).toBeLessThan(list.indexOf(old))
    })

    it('lists the whole library when there are no words', async () => {
      const body = await search('limit=200')
      expect(body.total).toBeGreaterThanOrEqual(24 + 40 + 10)
    })

    it.each(['status=retired', 'collection=drawings', 'limit=0', 'junctionType=roof'])('answers 400 to a bad filter (%s)', async (query) => {
      expect((await call(`/api/library/search?${query}`)).status).toBe(400)
    })
  })

  describe('items', () => {
    it('answers an item with its body as sanitised HTML, related items and key values', async () => {
      const res = await call('/api/library/items/D-WIN-03')
      expect(res.status).toBe(200)
      expect(res.body).toMatchObject({ code: 'D-WIN-03', collection: 'details', revision: 'B', status: 'current', drawingUrl: '/library/drawings/D-WIN-03.svg' })
      expect(res.body.psi).toBeTypeOf('number')
      expect(res.body.modelledValuesNote).toMatch(/invented/i)
      expect(res.body.bodyHtml).toContain('<h2>')
      expect(res.body.bodyHtml).not.toMatch(/<script|on\w+=/i)
      // codes in the text link to their pages
      expect(res.body.bodyHtml).toContain('<a href="/library/C-MAS-03">C-MAS-03</a>')
      expect(res.body.related.map((r: Summary) => r.code)).toContain('D-WIN-01')
      expect(res.body.revisions.at(-1).revision).toBe('B')
    })

    it('names the successor of a superseded item, and the successor names what it replaced', async () => {
      const old = await call('/api/library/items/D-GRD-01')
      expect(old.body).toMatchObject({ status: 'superseded', supersededBy: 'D-GRD-03', successor: { code: 'D-GRD-03' } })
      const next = await call('/api/library/items/D-GRD-03')
      expect(next.body.supersedes.map((r: Summary) => r.code)).toContain('D-GRD-01')
    })

    it.each([
      { path: '/api/library/items/NOT-A-CODE', status: 400 },
      { path: '/api/library/items/D-XYZ-99', status: 404 },
      { path: '/api/library/items/D-XYZ-99/sheet.pdf', status: 404 },
      { path: '/api/library/items/C-ETICS-01/drawing.svg', status: 404 }, // a clause has no drawing
      { path: '/api/library/items/..%2F..%2Fetc/drawing.svg', status: 400 },
    ])('answers $status for $path', async ({ path, status }) => {
      expect((await call(path)).status).toBe(status)
    })

    it('serves the detail sheet as a real PDF whose text has the title, code, revision and the demo label', async () => {
      const res = await fetch('/api/library/items/D-WIN-03/sheet.pdf')
      expect(res.status).toBe(200)
      expect(res.headers.get('content-type')).toBe('application/pdf')
      expect(res.headers.get('content-disposition')).toMatch(/attachment; filename="D-WIN-03-rev-B\.pdf"/)
      const bytes = new Uint8Array(await res.arrayBuffer())
      expect(new TextDecoder().decode(bytes.slice(0, 5))).toBe('%PDF-')
      const { pages, text } = await pdfText(bytes)
      expect(pages).toBeGreaterThanOrEqual(1)
      for (const expected of ['Window jamb, frame at block face', 'D-WIN-03', 'Revision', 'invented demo value', 'competent designer', `Page 1 of ${pages}`]) {
        expect(text).toContain(expected)
      }
      // The drawing is placed as vectors: its own labels come through as text.
      expect(text).toContain('OUTSIDE')
    })

    it('prints a sheet for a clause too (no drawing)', async () => {
      const res = await fetch('/api/library/items/C-ETICS-01/sheet.pdf')
      expect(res.status).toBe(200)
      const { text } = await pdfText(new Uint8Array(await res.arrayBuffer()))
      expect(text).toContain('The external insulation system as a whole')
    })

    it('downloads the drawing as SVG, with its content type, as an attachment', async () => {
      const res = await fetch('/api/library/items/D-WIN-03/drawing.svg')
      expect(res.status).toBe(200)
      expect(res.headers.get('content-type')).toMatch(/^image\/svg\+xml/)
      expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="D-WIN-03-rev-B\.svg"/)
      const svg = await res.text()
      expect(XMLValidator.validate(svg)).toBe(true)
      expect(svg).toContain('<svg')
    })
  })

  describe('suggestions for an enquiry', () => {
    it('suggests window details and clauses for a question about a window head, to staff only', async () => {
      const text = 'Window head and lintel. How should the insulation and render be detailed over the window head '
        + 'where the frame sits at the block face? Project: terrace of six houses.'
      const res = await call('/api/library/suggest', { body: { text }, cookie: officer })
      expect(res.status).toBe(200)
      const suggested = codes(res.body.suggestions)
      expect(suggested.length).toBeGreaterThan(0)
      expect(suggested.slice(0, 3)).toContain('D-WIN-01')
      expect(res.body.suggestions.every((s: Summary) => s.collection !== 'guidance' && s.status === 'current')).toBe(true)

      expect((await call('/api/library/suggest', { body: { text } })).status).toBe(401)
      expect((await call('/api/library/suggest', { body: { text }, cookie: await signIn(demo.specA) })).status).toBe(403)
      expect((await call('/api/library/suggest', { body: {}, cookie: officer })).status).toBe(400)
    })
  })

  describe('a manager marks an item superseded', () => {
    const path = `/api/library/items/${marked}/supersede`

    it('refuses an officer and anonymous callers, and a request without an origin', async () => {
      expect((await call(path, { body: { successor }, cookie: officer })).status).toBe(403)
      expect((await call(path, { body: { successor } })).status).toBe(401)
      expect((await call(path, { body: { successor }, cookie: manager, origin: false })).status).toBe(403)
      expect((await call(`/api/library/items/${marked}`)).body.status).toBe('current')
    })

    it.each([
      { label: 'itself', successor: marked, status: 422 },
      { label: 'an unknown item', successor: 'G-SITE-99', status: 422 },
      { label: 'an item of another kind', successor: 'D-WIN-03', status: 422 },
      { label: 'a superseded item of the same kind', successor: 'C-MOR-05', status: 409, item: 'C-MOR-04' },
      { label: 'no successor at all', successor: undefined, status: 400 },
      { label: 'a malformed code', successor: 'site two', status: 400 },
    ])('refuses $label as the successor', async ({ successor: next, status, item }) => {
      const res = await call(`/api/library/items/${item ?? marked}/supersede`, { body: next === undefined ? {} : { successor: next }, cookie: manager })
      expect(res.status, JSON.stringify(res.body)).toBe(status)
    })

    it('shows the mark over the content status in the item, the search and the filters, audits it, and can take it away', async () => {
      const res = await call(path, { body: { successor }, cookie: manager })
      expect(res.status, JSON.stringify(res.body)).toBe(200)
      expect(res.body).toMatchObject({ code: marked, status: 'superseded', supersededBy: successor, contentStatus: 'current', override: { status: 'superseded' } })

      const item = await call(`/api/library/items/${marked}`)
      expect(item.body).toMatchObject({ status: 'superseded', successor: { code: successor } })
      expect(codes((await search('status=superseded&limit=200')).results)).toContain(marked)
      expect(codes((await search('status=current&limit=200')).results)).not.toContain(marked)

      const [audit] = await testDb().query<{ action: string, detail: string }>(
        'SELECT action, detail FROM audit_events WHERE subject_type = ? AND subject_id = ? ORDER BY id DESC LIMIT 1',
        { replacements: ['library-item', marked], type: QueryTypes.SELECT })
      expect(audit?.action).toBe('library.superseded')
      expect(JSON.parse(audit!.detail)).toMatchObject({ successor, previousStatus: 'current' })
      const [row] = await testDb().query<{ status: string, superseded_by: string }>(
        'SELECT status, superseded_by FROM library_overrides WHERE code = ?', { replacements: [marked], type: QueryTypes.SELECT })
      expect(row).toMatchObject({ status: 'superseded', superseded_by: successor })

      const cleared = await call(path, { body: { successor: null }, cookie: manager })
      expect(cleared.status).toBe(200)
      expect(cleared.body).toMatchObject({ status: 'current', supersededBy: null, override: null })
      expect((await call(`/api/library/items/${marked}`)).body.status).toBe('current')
    })

    it('ranks an item marked superseded below its successor', async () => {
      expect((await call(path, { body: { successor }, cookie: manager })).status).toBe(200)
      const list = codes((await search('q=site&limit=200')).results)
      expect(list).toContain(marked)
      expect(list.indexOf(successor)).toBeLessThan(list.indexOf(marked))
      expect((await call(path, { body: { successor: null }, cookie: manager })).status).toBe(200)
    })
  })
})
