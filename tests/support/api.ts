// A small HTTP client for API tests: keeps one person's session cookie and sends the
// X-Wayside header the server demands on state changes.
import { BASE_URL, DEMO_PASSWORD } from './env'

export type Answer<T = any> = { status: number, body: T, headers: Headers }

export class ApiClient {
  cookie = ''
  constructor(readonly base = BASE_URL) {}

  async request<T = any>(
    method: string,
    path: string,
    opts: { json?: unknown, body?: BodyInit, headers?: Record<string, string>, noWaysideHeader?: boolean } = {},
  ): Promise<Answer<T>> {
    const headers: Record<string, string> = { ...opts.headers }
    if (!opts.noWaysideHeader) headers['x-wayside'] = '1'
    if (this.cookie) headers.cookie = this.cookie
    let body = opts.body
    if (opts.json !== undefined) {
      body = JSON.stringify(opts.json)
      headers['content-type'] = 'application/json'
    }
    const res = await fetch(this.base + path, { method, headers, body, redirect: 'manual' })
    const set = res.headers.getSetCookie()
    for (const c of set) {
      const pair = c.split(';')[0]!
      if (pair.startsWith('nuxt-session=')) this.cookie = pair.endsWith('=') ? '' : pair
    }
    const text = await res.text()
    let parsed: any = text
    try {
      parsed = text ? JSON.parse(text) : null
    }
    catch { /* not JSON: keep the text */ }
    return { status: res.status, body: parsed as T, headers: res.headers }
  }

  get<T = any>(path: string) { return this.request<T>('GET', path) }
  post<T = any>(path: string, json?: unknown) { return this.request<T>('POST', path, { json: json ?? {} }) }
  patch<T = any>(path: string, json: unknown) { return this.request<T>('PATCH', path, { json }) }

  async login(email: string, password = DEMO_PASSWORD) {
    const r = await this.post('/api/auth/login', { email, password })
    if (r.status !== 200) throw new Error(`sign-in as ${email} failed: ${r.status} ${JSON.stringify(r.body)}`)
    return r.body.user as { id: string, email: string, name: string, role: string }
  }
}

/** Signed in on the slot's test server; one argument only, so `emails.map(signedIn)` works. */
export function signedIn(email: string) {
  return signedInAt(BASE_URL, email)
}

/** Signed in on a server of a test's own. */
export async function signedInAt(base: string, email: string) {
  const c = new ApiClient(base)
  const user = await c.login(email)
  return Object.assign(c, { user })
}
