import type { H3Event } from 'h3'
import { inArray, sql } from 'drizzle-orm'

// Failed sign-ins are counted per account and per address; each failure slows the next answer,
// and past the limit the key is refused until the lock runs out.
const keysFor = (email: string, ip: string) => [`email:${email.toLowerCase()}`, `ip:${ip}`]

function limits() {
  const c = useRuntimeConfig()
  const perAccount = Number(c.loginMaxFailures)
  return { perAccount, perAddress: Number(c.loginMaxFailuresPerAddress), lockMs: Number(c.loginLockMinutes) * 60_000 }
}

/** Throws 429 with Retry-After while either key is locked; otherwise returns a delay in ms. */
export async function checkLoginAllowed(event: H3Event, email: string, ip: string): Promise<number> {
  const rows = await useDb().select().from(tables.loginAttempts).where(inArray(tables.loginAttempts.key, keysFor(email, ip)))
  const now = Date.now()
  let failures = 0
  for (const r of rows) {
    if (r.lockedUntil && r.lockedUntil.getTime() > now) {
      const retryAfter = Math.ceil((r.lockedUntil.getTime() - now) / 1000)
      setResponseHeader(event, 'retry-after', retryAfter)
      throw createError({ status: 429, statusText: 'Too many failed sign-ins; try again later', data: { retryAfter } })
    }
    failures = Math.max(failures, r.failures)
  }
  return Math.min(failures * 250, 2000)
}

export async function recordLoginFailure(email: string, ip: string) {
  const { perAccount, perAddress, lockMs } = limits()
  const lockAt = new Date(Date.now() + lockMs)
  for (const key of keysFor(email, ip)) {
    const max = key.startsWith('email:') ? perAccount : perAddress
    // A count older than the lock window starts again, so old typos do not add up forever.
    const stale = sql`(login_attempts.last_failure_at < now() - make_interval(secs => ${lockMs / 1000}) OR coalesce(login_attempts.locked_until < now(), false))`
    const next = sql`CASE WHEN ${stale} THEN 1 ELSE login_attempts.failures + 1 END`
    await useDb().execute(sql`
      INSERT INTO login_attempts (key, failures, last_failure_at, locked_until)
      VALUES (${key}, 1, now(), ${max <= 1 ? lockAt : null})
      ON CONFLICT (key) DO UPDATE SET
        failures = ${next},
        last_failure_at = now(),
        locked_until = CASE WHEN ${next} >= ${max} THEN ${lockAt}::timestamptz ELSE NULL END`)
  }
}

export async function clearLoginFailures(email: string) {
  await useDb().delete(tables.loginAttempts).where(inArray(tables.loginAttempts.key, [`email:${email.toLowerCase()}`]))
}
