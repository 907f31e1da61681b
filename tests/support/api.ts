import { fetch, url } from '@nuxt/test-utils/e2e'

export const DEMO_PASSWORD = 'corrstone-demo-2026'

export const demo = {
  admin: 'admin@corrstone.example',
  manager: 'manager@corrstone.example',
  officer: 'officer@corrstone.example',
  officer2: 'officer2@corrstone.example',
  specA: 'architect@hallorans.example', // Halloran Reid Architects
  specB: 'engineer@keel.example', // Keel Structural
} as const

// Response bodies are whatever JSON the route returns; tests read them freely.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export interface ApiResponse<T = any> {
  status: number
  body: T
  headers: Headers
}

export interface CallOptions {
  method?: string
  body?: unknown
  cookie?: string
  /** The page origin a browser would send; false leaves the header out (a forged or scripted request). */
  origin?: string | false
  headers?: Record<string, string>
}

/** One request to the built server, cookies carried by hand, the body parsed when it is JSON. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export async function call<T = any>(path: string, options: CallOptions = {}): Promise<ApiResponse<T>> {
  const method = options.method ?? (options.body === undefined ? 'GET' : 'POST')
  const headers: Record<string, string> = { accept: 'application/json', ...options.headers }
  if (options.cookie) headers.cookie = options.cookie
  const origin = options.origin === undefined ? new URL(url('/')).origin : options.origin
  if (origin) headers.origin = origin
  let body: string | undefined
  if (options.body !== undefined) {
    headers['content-type'] = 'application/json'
    body = JSON.stringify(options.body)
  }
  const res = await fetch(path, { method, headers, body, redirect: 'manual' })
  const text = await res.text()
  let parsed: unknown = text
  try { parsed = text ? JSON.parse(text) : null }
  catch { /* not JSON */ }
  return { status: res.status, body: parsed as T, headers: res.headers }
}

/** The session cookie from a response's Set-Cookie, ready for a Cookie header. */
export function sessionCookie(res: ApiResponse): string {
  const raw = res.headers.getSetCookie().find(c => c.startsWith('perpend-session='))
  if (!raw) throw new Error(`no session cookie in response (status ${res.status})`)
  return raw.split(';')[0]!
}

export async function signIn(email: string, password = DEMO_PASSWORD, headers: Record<string, string> = {}): Promise<string> {
  const res = await call('/api/auth/sign-in', { body: { email, password }, headers })
  if (res.status !== 200) throw new Error(`sign-in as ${email} answered ${res.status}: ${JSON.stringify(res.body)}`)
  return sessionCookie(res)
}

export function currentYear(): number {
  return new Date().getUTCFullYear()
}

/** A multipart request, as the browser's forms send it (the boundary is set by fetch). */
export async function callForm<T = any>(path: string, form: FormData, options: Omit<CallOptions, 'body'> = {}): Promise<ApiResponse<T>> { // eslint-disable-line @typescript-eslint/no-explicit-any
  const headers: Record<string, string> = { accept: 'application/json', ...options.headers }
  if (options.cookie) headers.cookie = options.cookie
  const origin = options.origin === undefined ? new URL(url('/')).origin : options.origin
  if (origin) headers.origin = origin
  const res = await fetch(path, { method: options.method ?? 'POST', headers, body: form, redirect: 'manual' })
  const text = await res.text()
  let parsed: unknown = text
  try { parsed = text ? JSON.parse(text) : null }
  catch { /* not JSON */ }
  return { status: res.status, body: parsed as T, headers: res.headers }
}
