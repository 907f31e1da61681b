import { QueryTypes } from 'sequelize'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startMailCatcher } from '../../scripts/mail-catcher'
import type { MailCatcher } from '../../scripts/mail-catcher'
import { call, demo, sessionCookie, signIn } from '../support/api'
import { closeTestDb, testDb } from '../support/db'
import { useBuiltServer } from '../support/server'

const catcher: MailCatcher = await startMailCatcher({ port: 0 })
// Each test that exercises the per-address limit uses its own documentation address (RFC 5737) through a
// trusted proxy header, so lock-outs here never lock the other test files out of 127.0.0.1.
let nextAddress = 10
const freshAddress = () => ({ 'x-forwarded-for': `203.0.113.${nextAddress++}` })

function tokenFrom(text: string): string {
  const m = /token=([A-Za-z0-9_-]{43})/.exec(text)
  if (!m) throw new Error(`no token link in: ${text}`)
  return m[1]!
}

async function registerAndVerify(email: string): Promise<void> {
  const res = await call('/api/auth/register', {
    body: { name: 'Test Specifier', email, password: 'a-long-test-password', organisationName: `Practice of ${email}`, organisationKind: 'architect' },
    headers: freshAddress(),
  })
  expect(res.status).toBe(202)
  const mail = await catcher.waitFor(m => m.envelopeTo.includes(email) && /Confirm/.test(m.subject))
  const verified = await call('/api/auth/verify-email', { body: { token: tokenFrom(mail.text) } })
  expect(verified.status).toBe(200)
}

describe('accounts and sign-in', async () => {
  await useBuiltServer({ NUXT_MAIL_URL: `smtp://127.0.0.1:${catcher.port}`, NUXT_TRUST_PROXY: 'true' })
  let adminCookie = ''
  beforeAll(async () => { adminCookie = await signIn(demo.admin) })
  afterAll(async () => {
    await catcher.close()
    await closeTestDb()
  })

  it('answers a wrong password and an unknown e-mail with the same vague 401', async () => {
    const headers = freshAddress()
    const wrong = await call('/api/auth/sign-in', { body: { email: demo.officer2, password: 'not-the-password' }, headers })
    const unknown = await call('/api/auth/sign-in', { body: { email: 'nobody@nowhere.example', password: 'not-the-password' }, headers })
    expect(wrong.status).toBe(401)
    expect(unknown.status).toBe(401)
    expect(unknown.body.message).toBe(wrong.body.message)
    expect(wrong.body.message).toBe('That e-mail and password do not match an active account.')
  })

  it('locks an account out after 10 failures in 15 minutes, even for the right password, and says when to retry', async () => {
    const email = 'lockout@example.invalid'
    await registerAndVerify(email)
    for (let i = 0; i < 10; i++) {
      const res = await call('/api/auth/sign-in', { body: { email, password: 'wrong-password' }, headers: freshAddress() })
      expect(res.status).toBe(401)
    }
    const locked = await call('/api/auth/sign-in', { body: { email, password: 'a-long-test-password' }, headers: freshAddress() })
    expect(locked.status).toBe(429)
    expect(Number(locked.headers.get('retry-after'))).toBeGreaterThan(800)
    expect(locked.body.message).toMatch(/Try again in 1[45] minutes/)
  })

  it('locks an unknown e-mail out the same way, so the lock-out reveals nothing', async () => {
    for (let i = 0; i < 10; i++) await call('/api/auth/sign-in', { body: { email: 'ghost@nowhere.example', password: 'x' }, headers: freshAddress() })
    const locked = await call('/api/auth/sign-in', { body: { email: 'ghost@nowhere.example', password: 'x' }, headers: freshAddress() })
    expect(locked.status).toBe(429)
  })

  it('locks an address out after 30 failures across accounts', async () => {
    const headers = freshAddress()
    for (let i = 0; i < 30; i++) await call('/api/auth/sign-in', { body: { email: `probe${i}@nowhere.example`, password: 'x' }, headers })
    const locked = await call('/api/auth/sign-in', { body: { email: demo.officer2, password: 'corrstone-demo-2026' }, headers })
    expect(locked.status).toBe(429)
    const elsewhere = await call('/api/auth/sign-in', { body: { email: demo.officer2, password: 'corrstone-demo-2026' }, headers: freshAddress() })
    expect(elsewhere.status).toBe(200)
  })

  it('refuses sign-in until the e-mail address is confirmed, and a verification link works only once', async () => {
    const email = 'verify-once@example.invalid'
    const headers = freshAddress()
    await call('/api/auth/register', { body: { name: 'Once', email, password: 'a-long-test-password', organisationName: 'Once Practice' }, headers })
    const early = await call('/api/auth/sign-in', { body: { email, password: 'a-long-test-password' }, headers })
    expect(early.status).toBe(403)
    const mail = await catcher.waitFor(m => m.envelopeTo.includes(email))
    const token = tokenFrom(mail.text)
    expect((await call('/api/auth/verify-email', { body: { token } })).status).toBe(200)
    const again = await call('/api/auth/verify-email', { body: { token } })
    expect(again.status).toBe(400)
    expect(again.body.message).toMatch(/expired or has already been used/)
    expect((await call('/api/auth/sign-in', { body: { email, password: 'a-long-test-password' }, headers })).status).toBe(200)
  })

  it('refuses an expired reset link', async () => {
    const email = 'expired-reset@example.invalid'
    await registerAndVerify(email)
    expect((await call('/api/auth/forgot-password', { body: { email } })).status).toBe(202)
    const mail = await catcher.waitFor(m => m.envelopeTo.includes(email) && /new Perpend password/.test(m.subject))
    await testDb().query(
      `UPDATE user_tokens t JOIN users u ON u.id = t.user_id SET t.expires_at = NOW() - INTERVAL 1 MINUTE
       WHERE u.email = ? AND t.purpose = 'reset-password'`, { replacements: [email], type: QueryTypes.UPDATE })
    const res = await call('/api/auth/set-password', { body: { token: tokenFrom(mail.text), password: 'another-long-password' } })
    expect(res.status).toBe(400)
    // The old password still works: nothing was changed.
    expect((await call('/api/auth/sign-in', { body: { email, password: 'a-long-test-password' }, headers: freshAddress() })).status).toBe(200)
  })

  it('answers the forgotten-password form the same for unknown addresses and sends nothing', async () => {
    const before = catcher.messages.length
    const res = await call('/api/auth/forgot-password', { body: { email: 'unknown-person@nowhere.example' } })
    expect(res.status).toBe(202)
    await new Promise(r => setTimeout(r, 500))
    expect(catcher.messages.slice(before).filter(m => m.envelopeTo.includes('unknown-person@nowhere.example'))).toEqual([])
  })

  it('invites staff, who choose a password from the link and can then sign in', async () => {
    const email = 'new-officer@corrstone.example'
    const res = await call('/api/admin/users', { cookie: adminCookie, body: { name: 'Róisín New', email, role: 'officer' } })
    expect(res.status).toBe(201)
    const mail = await catcher.waitFor(m => m.envelopeTo.includes(email))
    expect(mail.subject).toBe('Your Perpend account is ready')
    expect((await call('/api/auth/set-password', { body: { token: tokenFrom(mail.text), password: 'officer-chosen-password' } })).status).toBe(200)
    const cookie = await signIn(email, 'officer-chosen-password', freshAddress())
    const me = await call('/api/auth/me', { cookie })
    expect(me.body.user).toMatchObject({ email, role: 'officer' })
  })

  it('ends a deactivated person\'s live session on their next request, and records it in the audit trail', async () => {
    const email = 'soon-gone@example.invalid'
    await registerAndVerify(email)
    const signedIn = await call('/api/auth/sign-in', { body: { email, password: 'a-long-test-password' }, headers: freshAddress() })
    const cookie = sessionCookie(signedIn)
    expect((await call('/api/my/enquiries', { cookie })).status).toBe(200)
    const userId = signedIn.body.user.id as number

    expect((await call(`/api/admin/users/${userId}`, { method: 'PATCH', cookie: adminCookie, body: { active: false } })).status).toBe(200)
    const after = await call('/api/my/enquiries', { cookie })
    expect(after.status).toBe(401)
    expect((await call('/api/auth/me', { cookie })).body.user).toBeNull()

    const audit = await call('/api/admin/audit', { cookie: adminCookie })
    const actions = (audit.body.events as { action: string, subjectId: string }[]).filter(e => e.subjectId === String(userId)).map(e => e.action)
    expect(actions).toEqual(expect.arrayContaining(['register', 'email.verified', 'sign-in', 'user.deactivated']))
  })

  it('records role changes and failed sign-ins with who, what and the address', async () => {
    const email = 'promoted@example.invalid'
    await registerAndVerify(email)
    const [user] = await testDb().query<{ id: number }>('SELECT id FROM users WHERE email = ?', { replacements: [email], type: QueryTypes.SELECT })
    expect((await call(`/api/admin/users/${user!.id}`, { method: 'PATCH', cookie: adminCookie, body: { role: 'officer' } })).status).toBe(200)
    await call('/api/auth/sign-in', { body: { email, password: 'wrong' }, headers: { 'x-forwarded-for': '198.51.100.7' } })
    const rows = await testDb().query<{ action: string, ip: string, detail: string, actor_user_id: number | null }>(
      'SELECT action, ip, detail, actor_user_id FROM audit_events WHERE subject_id = ? ORDER BY id', { replacements: [String(user!.id)], type: QueryTypes.SELECT })
    const roleChange = rows.find(r => r.action === 'user.role-changed')!
    expect(JSON.parse(roleChange.detail)).toEqual({ from: 'specifier', to: 'officer' })
    expect(roleChange.actor_user_id).not.toBeNull()
    expect(rows.find(r => r.action === 'sign-in.failed')!.ip).toBe('198.51.100.7')
  })

  it('lets a specifier see their own organisation\'s enquiry and answers 404 for another organisation\'s', async () => {
    const [theirs] = await testDb().query<{ ref: string }>(
      `SELECT e.ref FROM enquiries e JOIN organisations o ON o.id = e.organisation_id WHERE o.name = 'Halloran Reid Architects' LIMIT 1`, { type: QueryTypes.SELECT })
    const own = await call(`/api/enquiries/${theirs!.ref}`, { cookie: await signIn(demo.specA, undefined, freshAddress()) })
    expect(own.status).toBe(200)
    const other = await call(`/api/enquiries/${theirs!.ref}`, { cookie: await signIn(demo.specB, undefined, freshAddress()) })
    expect(other.status).toBe(404)
    const missing = await call('/api/enquiries/TQ-1999-9999', { cookie: await signIn(demo.specB, undefined, freshAddress()) })
    expect(missing.body.message).toBe(other.body.message)
  })

  it('refuses a cookie-authenticated write without the same-origin guard', async () => {
    const noOrigin = await call('/api/admin/organisations', { cookie: adminCookie, origin: false, body: { name: 'Forged Ltd', kind: 'other' } })
    expect(noOrigin.status).toBe(403)
    const foreign = await call('/api/admin/organisations', { cookie: adminCookie, origin: 'http://attacker.example', body: { name: 'Forged Ltd', kind: 'other' } })
    expect(foreign.status).toBe(403)
    const [{ n }] = await testDb().query<{ n: number }>(`SELECT COUNT(*) AS n FROM organisations WHERE name = 'Forged Ltd'`, { type: QueryTypes.SELECT }) as [{ n: number }]
    expect(Number(n)).toBe(0)
  })

  it('sets the session cookie HttpOnly, Secure and SameSite=Lax, holding no secret', async () => {
    const res = await call('/api/auth/sign-in', { body: { email: demo.officer2, password: 'corrstone-demo-2026' }, headers: freshAddress() })
    const raw = res.headers.getSetCookie().find(c => c.startsWith('perpend-session='))!
    expect(raw).toMatch(/HttpOnly/i)
    expect(raw).toMatch(/Secure/i)
    expect(raw).toMatch(/SameSite=Lax/i)
    expect(Object.keys(res.body.user).sort()).toEqual(['email', 'id', 'name', 'organisationId', 'role'])
  })
})
