import { afterAll, describe, expect, it } from 'vitest'
import { QueryTypes } from 'sequelize'
import { call, demo, signIn } from '../support/api'
import { closeTestDb, testDb } from '../support/db'
import { useBuiltServer } from '../support/server'

/**
 * Behind a trusted proxy (NUXT_TRUST_PROXY=true): HSTS when the proxy says the caller came over TLS, and the
 * per-address limits on sign-in, the public calculators and the account mails, each answered 429 with
 * Retry-After. Each test uses its own documentation address (RFC 5737) so it locks nobody else out.
 */
let nextAddress = 100
const freshAddress = () => ({ 'x-forwarded-for': `198.51.100.${nextAddress++}` })

describe('behind a trusted proxy', async () => {
  await useBuiltServer({ NUXT_TRUST_PROXY: 'true' })
  afterAll(closeTestDb)

  it('sends Strict-Transport-Security only when the proxy says the request came over TLS', async () => {
    const tls = await call('/', { headers: { 'x-forwarded-proto': 'https', accept: 'text/html' } })
    expect(tls.headers.get('strict-transport-security')).toBe('max-age=31536000; includeSubDomains')
    const api = await call('/api/health', { headers: { 'x-forwarded-proto': 'https' } })
    expect(api.headers.get('strict-transport-security')).toBe('max-age=31536000; includeSubDomains')
    const plain = await call('/', { headers: { 'x-forwarded-proto': 'http', accept: 'text/html' } })
    expect(plain.headers.get('strict-transport-security')).toBeNull()
    expect((await call('/', { headers: { accept: 'text/html' } })).headers.get('strict-transport-security')).toBeNull()
  })

  it('sign-in: the 11th failure in a row for one account is 429 with Retry-After', async () => {
    const email = 'rate-limit-probe@example.invalid'
    try {
      for (let i = 0; i < 10; i++) {
        expect((await call('/api/auth/sign-in', { body: { email, password: `wrong-${i}` }, headers: freshAddress() })).status).toBe(401)
      }
      const locked = await call('/api/auth/sign-in', { body: { email, password: 'wrong-again' }, headers: freshAddress() })
      expect(locked.status).toBe(429)
      expect(Number(locked.headers.get('retry-after'))).toBeGreaterThan(0)
      expect(locked.body.message).toMatch(/Too many failed sign-in attempts\. Try again in \d+ minutes?/)
    }
    finally {
      await testDb().query('DELETE FROM sign_in_attempts WHERE email = ?', { replacements: [email], type: QueryTypes.DELETE })
    }
  })

  it('the public U-value calculator: the 61st call in a minute from one address is 429 with Retry-After; another address goes on', async () => {
    const headers = freshAddress()
    const wall = { layers: [{ name: 'Block', thicknessMm: 300, lambda: 0.2 }] }
    const statuses: number[] = []
    let limited = null as Awaited<ReturnType<typeof call>> | null
    for (let i = 0; i < 61; i++) {
      const res = await call('/api/calc/u-value', { body: wall, headers })
      statuses.push(res.status)
      if (res.status === 429) limited = res
    }
    expect(statuses.slice(0, 60).every(s => s !== 429)).toBe(true)
    expect(statuses[60]).toBe(429)
    const retryAfter = Number(limited!.headers.get('retry-after'))
    expect(retryAfter).toBeGreaterThanOrEqual(1)
    expect(retryAfter).toBeLessThanOrEqual(60)
    expect((await call('/api/calc/u-value', { body: wall, headers: freshAddress() })).status).not.toBe(429)
  })

  it('forgotten-password mails: the 11th request in an hour from one address is 429 with Retry-After', async () => {
    const headers = freshAddress()
    for (let i = 0; i < 10; i++) {
      // Unknown addresses: the same answer as a known one, and nothing is written or sent.
      expect((await call('/api/auth/forgot-password', { body: { email: `nobody-${i}@example.invalid` }, headers })).status).toBe(202)
    }
    const limited = await call('/api/auth/forgot-password', { body: { email: 'nobody-10@example.invalid' }, headers })
    expect(limited.status).toBe(429)
    expect(Number(limited.headers.get('retry-after'))).toBeGreaterThan(3000)
    expect(limited.body.message).toMatch(/This form can be sent 10 times an hour from one address\. Try again in 60 minutes\./)
    expect((await call('/api/auth/forgot-password', { body: { email: 'nobody-11@example.invalid' }, headers: freshAddress() })).status).toBe(202)
  })

  it('registration counts against the same kind of limit', async () => {
    const res = await call('/api/auth/register', {
      body: { name: 'Limit Probe', email: `limit-probe-${Date.now()}@example.invalid`, password: 'a-long-test-password', organisationName: 'Limit Probe Practice', organisationKind: 'architect' },
      headers: freshAddress(),
    })
    expect(res.status, JSON.stringify(res.body)).toBe(202)
    expect(res.headers.get('ratelimit-limit')).toBe('10')
    expect(res.headers.get('ratelimit-remaining')).toBe('9')
  })

  it('anonymous enquiries: the 61st in an hour from one address is 429 and writes nothing; a signed-in specifier is not held', async () => {
    const headers = freshAddress()
    const body = (i: number) => ({
      requester: { name: 'Limit Probe', organisation: 'Limit Probe Practice', email: 'limit-probe@example.invalid', phone: '+353 1 555 0142' },
      project: { name: 'Limit probe', region: 'Dublin', stage: 'planning' },
      topic: 'other', subject: `Limit probe ${i}`, question: 'Is there a limit on anonymous enquiries from one address?', priority: 'normal',
    })
    for (let i = 0; i < 60; i++) {
      const res = await call('/api/enquiries', { body: body(i), headers })
      expect(res.status, JSON.stringify(res.body)).toBe(201)
    }
    const count = async () => Number((await testDb().query<{ n: number }>('SELECT COUNT(*) AS n FROM enquiries WHERE subject LIKE ?', { replacements: ['Limit probe %'], type: QueryTypes.SELECT }))[0]!.n)
    expect(await count()).toBe(60)
    const limited = await call('/api/enquiries', { body: body(60), headers })
    expect(limited.status).toBe(429)
    expect(Number(limited.headers.get('retry-after'))).toBeGreaterThan(3000)
    expect(limited.body.message).toMatch(/^At most 60 enquiries an hour can be sent from one address without signing in\. Sign in, or try again in \d+ minutes\.$/)
    expect(await count()).toBe(60)
    const specifier = await signIn(demo.specA, undefined, headers)
    expect((await call('/api/enquiries', { body: { ...body(61), requester: undefined }, headers, cookie: specifier })).status).toBe(201)
  })
})
