// Running for real: security headers and the content security policy, request ids and one log
// line per request, the health route, and a production start that refuses local settings.
import { spawn } from 'node:child_process'
import { randomBytes, randomUUID } from 'node:crypto'
import { fileURLToPath } from 'node:url'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient, signedIn } from '../support/api'
import { BASE_URL, DEMO, DEMO_PASSWORD } from '../support/env'
import { ownServerPort, startOwnServer, type OwnServer } from '../support/server'

const ENTRY = fileURLToPath(new URL('../../.output/server/index.mjs', import.meta.url))

describe('security headers', () => {
  it('a page carries the content security policy with a per-request nonce that its scripts carry', async () => {
    const res = await fetch(`${BASE_URL}/login`)
    expect(res.status).toBe(200)
    const csp = res.headers.get('content-security-policy') ?? ''
    const nonce = /'nonce-([^']+)'/.exec(csp)?.[1]
    expect(nonce).toBeTruthy()
    expect(csp).toMatch(/script-src 'self' 'strict-dynamic' 'nonce-/)
    expect(csp).toMatch(/object-src 'none'/)
    expect(csp).toMatch(/frame-ancestors 'self'/)
    expect(csp).toMatch(/img-src 'self' data: blob:/)
    expect(csp).not.toMatch(/upgrade-insecure-requests/)
    const html = await res.text()
    const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map(m => m[0]).filter(tag => !/type="application\/json"/.test(tag))
    expect(scripts.length).toBeGreaterThan(0)
    for (const tag of scripts) expect(tag, tag).toContain(`nonce="${nonce}"`)
    // Another request, another nonce.
    const again = (await fetch(`${BASE_URL}/login`)).headers.get('content-security-policy')
    expect(/'nonce-([^']+)'/.exec(again ?? '')?.[1]).not.toBe(nonce)

    expect(res.headers.get('x-content-type-options')).toBe('nosniff')
    expect(res.headers.get('x-frame-options')).toBe('SAMEORIGIN')
    expect(res.headers.get('referrer-policy')).toBe('same-origin')
    expect(res.headers.get('strict-transport-security')).toMatch(/max-age=\d+/)
    expect(res.headers.get('permissions-policy')).toMatch(/geolocation=\(self\)/)
    expect(res.headers.get('x-powered-by')).toBeNull()
  })

  it('the prerendered offline shell allows its own scripts by hash, so it runs with no server to give a nonce', async () => {
    const res = await fetch(`${BASE_URL}/shell`)
    expect(res.status).toBe(200)
    const html = await res.text()
    const meta = /<meta http-equiv="content-security-policy" content="([^"]+)"/i.exec(html)?.[1] ?? res.headers.get('content-security-policy') ?? ''
    expect(meta).toMatch(/script-src [^;]*'sha(256|384|512)-/)
  })

  it('API answers carry nosniff and no server banner', async () => {
    const res = await fetch(`${BASE_URL}/api/health`)
    expect(res.headers.get('x-content-type-options')).toBe('nosniff')
    expect(res.headers.get('x-powered-by')).toBeNull()
  })
})

describe('request ids', () => {
  it('keeps a sane incoming X-Request-Id and replaces one that is not', async () => {
    const mine = `lb-${randomUUID()}`
    expect((await fetch(`${BASE_URL}/api/health`, { headers: { 'x-request-id': mine } })).headers.get('x-request-id')).toBe(mine)
    const odd = await fetch(`${BASE_URL}/api/health`, { headers: { 'x-request-id': 'has spaces and {braces}' } })
    expect(odd.headers.get('x-request-id')).toMatch(/^[0-9a-f-]{36}$/)
    const none = await fetch(`${BASE_URL}/api/health`)
    expect(none.headers.get('x-request-id')).toMatch(/^[0-9a-f-]{36}$/)
  })

  it('a JSON error answer names the request id, and so does the error page', async () => {
    const r = await new ApiClient().get('/api/calls')
    expect(r.status).toBe(401)
    expect(r.body.requestId).toBe(r.headers.get('x-request-id'))
    // Signed in, so the page is not sent to the sign-in screen first.
    const office = await signedIn(DEMO.office)
    const headers = { accept: 'text/html', cookie: office.cookie }
    const page = await fetch(`${BASE_URL}/no-such-page-here`, { headers, redirect: 'manual' })
    expect(page.status).toBe(404)
    const id = page.headers.get('x-request-id')!
    expect(await page.text()).toContain(id)
  })
})

describe('health', () => {
  it('answers 200 with the database and the photo store up', async () => {
    const res = await fetch(`${BASE_URL}/api/health`)
    expect(res.status).toBe(200)
    expect(await res.json()).toEqual({ ok: true, database: 'ok', storage: 'ok' })
    expect(res.headers.get('cache-control')).toBe('no-store')
  })
})

describe('a production start', () => {
  const productionEnv = (extra: Record<string, string> = {}) => ({
    NODE_ENV: 'production', WAYSIDE_LOCAL: '', NUXT_SESSION_COOKIE_SECURE: 'true',
    NUXT_SESSION_PASSWORD: randomBytes(32).toString('hex'),
    NUXT_SMTP_HOST: 'smtp.example.invalid', NUXT_SMTP_PORT: '587',
    NUXT_STRIPE_SECRET_KEY: `sk_test_${randomBytes(12).toString('hex')}`,
    NUXT_STRIPE_WEBHOOK_SECRET: `whsec_${randomBytes(12).toString('hex')}`,
    NUXT_STRIPE_API_HOST: 'payments.example.invalid', NUXT_STRIPE_API_PROTOCOL: 'https',
    NUXT_SITE_URL: 'https://service.example.invalid',
    ...extra,
  })

  it('refuses the local secrets and the local fakes\' addresses, naming each variable to set', async () => {
    const proc = spawn(process.execPath, [ENTRY], {
      env: {
        ...process.env, NITRO_HOST: '127.0.0.1', NITRO_PORT: String(ownServerPort(8)),
        NODE_ENV: 'production', WAYSIDE_LOCAL: '', NUXT_SESSION_COOKIE_SECURE: 'false',
        NUXT_SESSION_PASSWORD: 'wayside-test-session-password-0123456789abcdef',
        NUXT_SMTP_HOST: '127.0.0.1', NUXT_SMTP_PORT: '2525', NUXT_STRIPE_API_HOST: '127.0.0.1', NUXT_STRIPE_API_PROTOCOL: 'http',
        NUXT_STRIPE_SECRET_KEY: 'sk_test_wayside_local', NUXT_STRIPE_WEBHOOK_SECRET: 'whsec_wayside_local',
        NUXT_SITE_URL: `http://127.0.0.1:${ownServerPort(8)}`,
      },
      stdio: ['ignore', 'pipe', 'pipe'],
    })
    let output = ''
    const keep = (b: Buffer) => {
      output += b.toString()
    }
    proc.stdout.on('data', keep)
    proc.stderr.on('data', keep)
    const code = await new Promise<number | null>(resolve => proc.once('exit', resolve))
    expect(code).toBe(1)
    const named = ['NUXT_SESSION_PASSWORD', 'NUXT_SESSION_COOKIE_SECURE', 'NUXT_SMTP_HOST', 'NUXT_STRIPE_SECRET_KEY',
      'NUXT_STRIPE_WEBHOOK_SECRET', 'NUXT_STRIPE_API_HOST', 'NUXT_SITE_URL']
    for (const v of named) {
      expect(output, v).toContain(v)
    }
  })

  describe('with its own settings', () => {
    let server: OwnServer
    beforeAll(async () => {
      server = await startOwnServer(ownServerPort(8), productionEnv())
    })
    afterAll(async () => {
      await server?.kill('SIGTERM')
    })

    it('starts, answers health, and seals a Secure session cookie', async () => {
      expect((await fetch(`${server.url}/api/health`)).status).toBe(200)
      const res = await fetch(`${server.url}/api/auth/login`, {
        method: 'POST', headers: { 'content-type': 'application/json', 'x-wayside': '1' },
        body: JSON.stringify({ email: DEMO.office, password: DEMO_PASSWORD }),
      })
      expect(res.status).toBe(200)
      const cookie = res.headers.getSetCookie().find(c => c.startsWith('nuxt-session='))!
      expect(cookie).toMatch(/;\s*Secure/i)
      expect(cookie).toMatch(/HttpOnly/i)
    })

    it('logs each request as one JSON line with its id, method, path, status and duration', async () => {
      const id = `probe-${randomUUID()}`
      const res = await fetch(`${server.url}/api/calls?q=secret+search`, { headers: { 'x-request-id': id } })
      expect(res.status).toBe(401)
      await server.waitForOutput(id)
      const line = server.output().split('\n').find(l => l.includes(id))!
      const entry = JSON.parse(line)
      expect(entry).toMatchObject({ level: 'info', requestId: id, method: 'GET', path: '/api/calls', status: 401 })
      expect(typeof entry.durationMs).toBe('number')
      expect(typeof entry.time).toBe('string')
      expect(line).not.toContain('secret')
    })
  })
})
