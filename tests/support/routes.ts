import { readdirSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'
import { QueryTypes } from 'sequelize'
import { call, callForm, currentYear, demo } from './api'
import { testDb } from './db'
import { tinyPng } from './files'
import { rootDir } from './server'

/**
 * Every route file under server/api and who may call it: the access matrix checks these answers, and the
 * security suite uses them to find, for each route, a caller who gets as far as the route's input checks.
 * Writes are expected with an empty body: a route that lets the caller in answers 400 (its input is checked
 * after its access), one that does not answers 401/403 first.
 * (nuxt-auth-utils' own GET /api/_auth/session is not a file here; it returns only the caller's own session.)
 */
export type Who = 'anon' | 'specA' | 'specB' | 'officer' | 'manager' | 'admin'
export const who: Who[] = ['anon', 'specA', 'specB', 'officer', 'manager', 'admin']
const row = (...codes: [number, number, number, number, number, number]) => Object.fromEntries(who.map((w, i) => [w, codes[i]])) as Record<Who, number>

// Placeholders ({ref}, {org}, {user}, {fileRef}, {file}) are filled from matrixValues below.
//                                                    anon specA specB officer manager admin
export const matrix: Record<string, { path: string, expect: Record<Who, number> }> = {
  'GET /api/health': { path: '/api/health', expect: row(200, 200, 200, 200, 200, 200) },
  'GET /api/auth/me': { path: '/api/auth/me', expect: row(200, 200, 200, 200, 200, 200) },
  'POST /api/auth/sign-in': { path: '/api/auth/sign-in', expect: row(400, 400, 400, 400, 400, 400) },
  'POST /api/auth/sign-out': { path: '/api/auth/sign-out', expect: row(200, 200, 200, 200, 200, 200) },
  'POST /api/auth/register': { path: '/api/auth/register', expect: row(400, 400, 400, 400, 400, 400) },
  'POST /api/auth/verify-email': { path: '/api/auth/verify-email', expect: row(400, 400, 400, 400, 400, 400) },
  'POST /api/auth/forgot-password': { path: '/api/auth/forgot-password', expect: row(400, 400, 400, 400, 400, 400) },
  'POST /api/auth/set-password': { path: '/api/auth/set-password', expect: row(400, 400, 400, 400, 400, 400) },
  'GET /api/admin/users': { path: '/api/admin/users', expect: row(401, 403, 403, 403, 403, 200) },
  'POST /api/admin/users': { path: '/api/admin/users', expect: row(401, 403, 403, 403, 403, 400) },
  'PATCH /api/admin/users/[id]': { path: '/api/admin/users/{user}', expect: row(401, 403, 403, 403, 403, 400) },
  'GET /api/admin/organisations': { path: '/api/admin/organisations', expect: row(401, 403, 403, 403, 403, 200) },
  'POST /api/admin/organisations': { path: '/api/admin/organisations', expect: row(401, 403, 403, 403, 403, 400) },
  'GET /api/admin/organisations/[id]': { path: '/api/admin/organisations/{org}', expect: row(401, 403, 403, 403, 403, 200) },
  'POST /api/admin/organisations/[id]/merge': { path: '/api/admin/organisations/{org}/merge', expect: row(401, 403, 403, 403, 403, 400) },
  'GET /api/admin/audit': { path: '/api/admin/audit', expect: row(401, 403, 403, 403, 403, 200) },
  'GET /api/my/enquiries': { path: '/api/my/enquiries', expect: row(401, 200, 200, 403, 403, 403) },
  'GET /api/enquiries': { path: '/api/enquiries', expect: row(401, 403, 403, 200, 200, 200) },
  'POST /api/enquiries': { path: '/api/enquiries', expect: row(400, 400, 400, 400, 400, 400) },
  'GET /api/enquiries/[ref]': { path: '/api/enquiries/{ref}', expect: row(401, 200, 404, 200, 200, 200) },
  'PATCH /api/enquiries/[ref]': { path: '/api/enquiries/{ref}', expect: row(401, 403, 403, 400, 400, 400) },
  'POST /api/enquiries/[ref]/messages': { path: '/api/enquiries/{ref}/messages', expect: row(401, 400, 404, 400, 400, 400) },
  'POST /api/enquiries/[ref]/merge': { path: '/api/enquiries/{ref}/merge', expect: row(401, 403, 403, 400, 400, 400) },
  'GET /api/enquiries/[ref]/attachments/[id]': { path: '/api/enquiries/{fileRef}/attachments/{file}', expect: row(401, 200, 404, 200, 200, 200) },
  'GET /api/enquiries/[ref]/calculations': { path: '/api/enquiries/{ref}/calculations', expect: row(401, 200, 404, 200, 200, 200) },
  'POST /api/enquiries/[ref]/calculations': { path: '/api/enquiries/{ref}/calculations', expect: row(401, 403, 403, 400, 400, 400) },
  'POST /api/calculations/[id]/rerun': { path: '/api/calculations/999999/rerun', expect: row(401, 403, 403, 404, 404, 404) },
  'GET /api/desk/officers': { path: '/api/desk/officers', expect: row(401, 403, 403, 200, 200, 200) },
  'GET /api/desk/targets': { path: '/api/desk/targets', expect: row(401, 403, 403, 200, 200, 200) },
  'GET /api/desk/stale-items': { path: '/api/desk/stale-items', expect: row(401, 403, 403, 200, 200, 200) },
  'PUT /api/desk/targets': { path: '/api/desk/targets', expect: row(401, 403, 403, 403, 400, 400) },
  'POST /api/calc/u-value': { path: '/api/calc/u-value', expect: row(400, 400, 400, 400, 400, 400) },
  'POST /api/calc/dew-point': { path: '/api/calc/dew-point', expect: row(400, 400, 400, 400, 400, 400) },
  'POST /api/calc/thickness': { path: '/api/calc/thickness', expect: row(401, 403, 403, 400, 400, 400) },
  'POST /api/calc/condensation': { path: '/api/calc/condensation', expect: row(401, 403, 403, 400, 400, 400) },
  'POST /api/calc/condensation-year': { path: '/api/calc/condensation-year', expect: row(401, 403, 403, 400, 400, 400) },
  'POST /api/calc/mould': { path: '/api/calc/mould', expect: row(401, 403, 403, 400, 400, 400) },
  'POST /api/calc/bridging': { path: '/api/calc/bridging', expect: row(401, 403, 403, 400, 400, 400) },
  'POST /api/calc/wind': { path: '/api/calc/wind', expect: row(401, 403, 403, 400, 400, 400) },
  'POST /api/calc/strength': { path: '/api/calc/strength', expect: row(401, 403, 403, 400, 400, 400) },
  'POST /api/calc/quantities': { path: '/api/calc/quantities', expect: row(401, 403, 403, 400, 400, 400) },
  'POST /api/calc/programme': { path: '/api/calc/programme', expect: row(401, 403, 403, 400, 400, 400) },
  'GET /api/price-book': { path: '/api/price-book', expect: row(401, 403, 403, 200, 200, 200) },
  'PUT /api/price-book/[code]': { path: '/api/price-book/blocks', expect: row(401, 403, 403, 403, 400, 400) },
  'GET /api/enquiries/[ref]/quotations': { path: '/api/enquiries/{ref}/quotations', expect: row(401, 200, 404, 200, 200, 200) },
  'POST /api/enquiries/[ref]/quotations': { path: '/api/enquiries/{ref}/quotations', expect: row(401, 403, 403, 400, 400, 400) },
  'POST /api/enquiries/[ref]/packs': { path: '/api/enquiries/{ref}/packs', expect: row(401, 403, 403, 400, 400, 400) },
  'GET /api/enquiries/[ref]/packs': { path: '/api/enquiries/{ref}/packs', expect: row(401, 200, 404, 200, 200, 200) },
  'POST /api/packs/[id]/approve': { path: '/api/packs/999999/approve', expect: row(401, 403, 403, 404, 404, 404) },
  'GET /api/turnaround': { path: '/api/turnaround', expect: row(401, 403, 403, 403, 200, 200) },
  'GET /api/turnaround/mine': { path: '/api/turnaround/mine', expect: row(401, 403, 403, 200, 200, 200) },
  'GET /api/turnaround/export.csv': { path: '/api/turnaround/export.csv', expect: row(401, 403, 403, 403, 200, 200) },
  'GET /api/library/search': { path: '/api/library/search?q=lintel', expect: row(200, 200, 200, 200, 200, 200) },
  'GET /api/library/items/[code]': { path: '/api/library/items/D-WIN-01', expect: row(200, 200, 200, 200, 200, 200) },
  'GET /api/library/items/[code]/sheet.pdf': { path: '/api/library/items/D-WIN-01/sheet.pdf', expect: row(200, 200, 200, 200, 200, 200) },
  'GET /api/library/items/[code]/drawing.svg': { path: '/api/library/items/D-WIN-01/drawing.svg', expect: row(200, 200, 200, 200, 200, 200) },
  'POST /api/library/items/[code]/supersede': { path: '/api/library/items/D-WIN-01/supersede', expect: row(401, 403, 403, 403, 400, 400) },
  'GET /api/admin/outbox': { path: '/api/admin/outbox', expect: row(401, 403, 403, 403, 403, 200) },
  'POST /api/admin/outbox/[id]/retry': { path: '/api/admin/outbox/999999/retry', expect: row(401, 403, 403, 403, 403, 404) },
  'GET /api/desk/quarantine': { path: '/api/desk/quarantine', expect: row(401, 403, 403, 200, 200, 200) },
  'POST /api/desk/quarantine/[id]': { path: '/api/desk/quarantine/999999', expect: row(401, 403, 403, 400, 400, 400) },
  'GET /api/enquiries/[ref]/mail': { path: '/api/enquiries/{ref}/mail', expect: row(401, 403, 403, 200, 200, 200) },
  // Authenticated by the mail provider's shared secret only, never by a session.
  'POST /api/mail/inbound': { path: '/api/mail/inbound', expect: row(401, 401, 401, 401, 401, 401) },
  // Off unless PERPEND_DEV_MAILBOX=1 (the demo start script); the test server runs without it.
  'GET /api/dev/mailbox': { path: '/api/dev/mailbox', expect: row(404, 404, 404, 404, 404, 404) },
  'POST /api/library/suggest': { path: '/api/library/suggest', expect: row(401, 403, 403, 400, 400, 400) },
}

/** 'server/api/admin/users/[id].patch.ts' → 'PATCH /api/admin/users/[id]' */
export function routeKey(file: string): string {
  const rel = relative(join(rootDir, 'server'), file).replace(/\\/g, '/').replace(/\.ts$/, '')
  const m = /^(.*?)(?:\.(get|post|put|patch|delete))?$/.exec(rel)!
  const path = `/${m[1]!.replace(/(^|\/)index$/, '')}`
  return `${(m[2] ?? 'all').toUpperCase()} ${path}`
}

export function routeFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = join(dir, name)
    return statSync(full).isDirectory() ? routeFiles(full) : name.endsWith('.ts') ? [full] : []
  })
}

/** Every route file as 'METHOD /api/path'. */
export const routeKeys = () => routeFiles(join(rootDir, 'server', 'api')).map(routeKey).sort()

/**
 * Values for the matrix's placeholders: {ref} an enquiry of specifier A's organisation, {org} that organisation,
 * {user} specifier A's user id, and {fileRef}/{file} a new enquiry of A's carrying one drawing.
 */
export async function matrixValues(specACookie: string): Promise<Record<string, string>> {
  const [user] = await testDb().query<{ id: number, organisation_id: number }>(
    'SELECT id, organisation_id FROM users WHERE email = ?', { replacements: [demo.specA], type: QueryTypes.SELECT })
  const [enquiry] = await testDb().query<{ ref: string }>(
    'SELECT ref FROM enquiries WHERE organisation_id = ? AND ref_year = ? ORDER BY ref_seq LIMIT 1',
    { replacements: [user!.organisation_id, currentYear()], type: QueryTypes.SELECT })
  const upload = new FormData()
  upload.append('data', JSON.stringify({
    project: { name: 'Matrix check house', region: 'Cork', stage: 'planning' },
    topic: 'other', subject: 'Access matrix drawing', question: 'An enquiry that carries one drawing for the access matrix.', priority: 'normal',
  }))
  upload.append('drawings', new Blob([tinyPng]), 'plan.png')
  const created = await callForm('/api/enquiries', upload, { cookie: specACookie })
  const file = await call(`/api/enquiries/${created.body.ref}`, { cookie: specACookie })
  return {
    user: String(user!.id),
    org: String(user!.organisation_id),
    ref: enquiry!.ref,
    fileRef: created.body.ref,
    file: String(file.body.attachments[0].id),
  }
}

/** A matrix path with its placeholders filled in. */
export const fillPath = (path: string, values: Record<string, string>) => path.replace(/\{(\w+)\}/g, (_, name: string) => values[name]!)
