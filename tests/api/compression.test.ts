// Nothing large goes out uncompressed: JSON answers (the first pull above all) and pages are
// compressed when the client takes it, static files were compressed at build, and a client that
// takes no compression gets the same answer plain.
import http from 'node:http'
import { brotliDecompressSync, gunzipSync } from 'node:zlib'
import { readdirSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn } from '../support/api'
import { closeTestPool } from '../support/db'
import { BASE_URL, DEMO } from '../support/env'

afterAll(closeTestPool)

type Raw = { status: number, headers: http.IncomingHttpHeaders, bytes: Buffer }

/** A GET that leaves the answer as it came over the wire (fetch would decode it). */
function raw(path: string, headers: Record<string, string>): Promise<Raw> {
  return new Promise((resolve, reject) => {
    http.get(new URL(path, BASE_URL), { headers, agent: false }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => resolve({ status: res.statusCode!, headers: res.headers, bytes: Buffer.concat(chunks) }))
    }).on('error', reject)
  })
}

function decoded(r: Raw): string {
  const enc = r.headers['content-encoding']
  if (enc === 'br') return brotliDecompressSync(r.bytes).toString()
  if (enc === 'gzip') return gunzipSync(r.bytes).toString()
  return r.bytes.toString()
}

let mechCookie = ''
beforeAll(async () => {
  mechCookie = (await signedIn(DEMO.mech1)).cookie
})

describe('compressed answers', () => {
  it('a mechanic\'s first pull comes brotli- or gzip-compressed as asked, and decodes to the plain answer', async () => {
    const plain = await raw('/api/sync/pull', { cookie: mechCookie })
    expect(plain.status).toBe(200)
    expect(plain.headers['content-encoding']).toBeUndefined()
    const body = JSON.parse(plain.bytes.toString())
    expect(body.changes).toBeTruthy()

    for (const [asked, want] of [['gzip, deflate, br', 'br'], ['gzip', 'gzip']] as const) {
      const r = await raw('/api/sync/pull', { 'cookie': mechCookie, 'accept-encoding': asked })
      expect(r.status).toBe(200)
      expect(r.headers['content-encoding']).toBe(want)
      expect(r.headers.vary).toMatch(/accept-encoding/i)
      expect(r.headers['content-type']).toMatch(/^application\/json/)
      expect(Number(r.headers['content-length'] ?? r.bytes.length)).toBe(r.bytes.length)
      expect(r.bytes.length).toBeLessThan(plain.bytes.length / 3)
      // The cursor moves with the clock: compare everything else.
      const got = JSON.parse(decoded(r))
      expect(Object.keys(got).sort()).toEqual(Object.keys(body).sort())
      expect(got.changes).toEqual(body.changes)
    }
  })

  it('leaves a small answer plain', async () => {
    const r = await raw('/api/health', { 'accept-encoding': 'br, gzip' })
    expect(r.status).toBe(200)
    expect(r.headers['content-encoding']).toBeUndefined()
    expect(JSON.parse(r.bytes.toString())).toMatchObject({ ok: true })
  })

  it('compresses a page, which still carries its nonce', async () => {
    const r = await raw('/login', { 'accept-encoding': 'br' })
    expect(r.status).toBe(200)
    expect(r.headers['content-encoding']).toBe('br')
    const nonce = /'nonce-([^']+)'/.exec(String(r.headers['content-security-policy']))?.[1]
    expect(decoded(r)).toContain(`nonce="${nonce}"`)
  })

  it('serves the built JavaScript precompressed (brotli, else gzip) with its usual type', async () => {
    const dir = fileURLToPath(new URL('../../.output/public/_nuxt/', import.meta.url))
    const files = readdirSync(dir)
    const js = files.find(f => f.endsWith('.js') && files.includes(`${f}.br`) && files.includes(`${f}.gz`))
    expect(js, 'a .js file with its .br and .gz beside it').toBeTruthy()
    const plain = await raw(`/_nuxt/${js}`, {})
    for (const [asked, want] of [['br, gzip', 'br'], ['gzip', 'gzip']] as const) {
      const r = await raw(`/_nuxt/${js}`, { 'accept-encoding': asked })
      expect(r.status).toBe(200)
      expect(r.headers['content-encoding']).toBe(want)
      expect(r.headers['content-type']).toMatch(/javascript/)
      expect(decoded(r)).toBe(plain.bytes.toString())
    }
  })
})
