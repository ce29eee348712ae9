// What the load and page benchmarks share: the bench server's address, a demo person's session
// cookie, and the server process's memory from /proc.
import { readFileSync } from 'node:fs'

export const BASE = process.env.WAYSIDE_BENCH_URL ?? process.env.WAYSIDE_TEST_URL ?? 'http://127.0.0.1:3190'
export const DEMO_PASSWORD = 'wayside-demo'

/** `nuxt-session=…` for a demo person, signed in through the real route. */
export async function sessionCookie(email: string): Promise<string> {
  const res = await fetch(`${BASE}/api/auth/login`, {
    method: 'POST', headers: { 'content-type': 'application/json', 'x-wayside': '1' },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  })
  if (!res.ok) throw new Error(`sign-in as ${email} failed: ${res.status}`)
  const cookie = res.headers.getSetCookie().map(c => c.split(';')[0]!).find(c => c.startsWith('nuxt-session='))
  if (!cookie) throw new Error(`sign-in as ${email} set no session cookie`)
  return cookie
}

/** Resident memory of a process in MB now (VmRSS) and at its peak since it started (VmHWM), from /proc. */
export function rssMb(pid: number): { now: number, peak: number } {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8')
  const kb = (field: string) => Number(new RegExp(`${field}:\\s+(\\d+)`).exec(status)?.[1] ?? Number.NaN)
  return { now: kb('VmRSS') / 1024, peak: kb('VmHWM') / 1024 }
}

export const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b)
  return s[Math.floor(s.length / 2)]!
}
