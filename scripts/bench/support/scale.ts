// What the scale benchmarks share: the server and database loaded with the scale seed (bench.sh
// starts a second server on it), sign-in, timing by median, and the floor they are held against.
import { request } from 'node:http'
import pg from 'pg'

export const SCALE_URL = process.env.WAYSIDE_BENCH_SCALE_URL ?? 'http://127.0.0.1:3191'
export const SCALE_DB = process.env.WAYSIDE_BENCH_SCALE_DB ?? 'postgres://wayside@127.0.0.1:54329/wayside_bench_scale'
export const ROUNDS = Number(process.env.WAYSIDE_BENCH_ROUNDS ?? 5)

export async function signIn(email: string) {
  const res = await fetch(`${SCALE_URL}/api/auth/login`, {
    method: 'POST', headers: { 'content-type': 'application/json', 'x-wayside': '1' },
    body: JSON.stringify({ email, password: 'wayside-demo' }),
  })
  if (!res.ok) throw new Error(`sign-in as ${email} failed: ${res.status}`)
  return res.headers.getSetCookie().map(c => c.split(';')[0]).find(c => c.startsWith('nuxt-session='))!
}

export const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!

/** The median time of `rounds` runs of `fn`, after one run to warm caches. */
export async function timed(fn: () => Promise<unknown>, rounds = ROUNDS) {
  await fn()
  const times: number[] = []
  for (let i = 0; i < rounds; i++) {
    const t = performance.now()
    await fn()
    times.push(performance.now() - t)
  }
  return median(times)
}

/** GET a JSON route of the scale server as `cookie`; fails loudly on anything but 200. */
export async function getJson<T>(path: string, cookie: string): Promise<T> {
  const res = await fetch(`${SCALE_URL}${path}`, { headers: { 'x-wayside': '1', cookie } })
  if (!res.ok) throw new Error(`${path}: ${res.status} ${(await res.text()).slice(0, 200)}`)
  return await res.json() as T
}

/** The bytes that cross the wire for GET `path` with `encoding` accepted (node:http leaves the body as sent). */
export function wireBytes(path: string, cookie: string, encoding: string) {
  return new Promise<{ bytes: number, encoding: string, body: Buffer }>((resolve, reject) => {
    const req = request(`${SCALE_URL}${path}`, { headers: { 'x-wayside': '1', cookie, 'accept-encoding': encoding } }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => {
        if (res.statusCode !== 200) return reject(new Error(`${path}: ${res.statusCode}`))
        const body = Buffer.concat(chunks)
        resolve({ bytes: body.length, encoding: String(res.headers['content-encoding'] ?? 'identity'), body })
      })
      res.on('error', reject)
    })
    req.on('error', reject)
    req.end()
  })
}

/** The floor of the list and report rows: counting every call, the least a page of the list could cost. */
export async function countFloor(pool: pg.Pool) {
  return timed(() => pool.query('SELECT count(*) FROM calls'), Math.max(ROUNDS, 7))
}

export const scalePool = () => new pg.Pool({ connectionString: SCALE_DB, max: 2 })
