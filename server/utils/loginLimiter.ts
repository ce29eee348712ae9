import type { H3Event } from 'h3'
import { sql } from 'drizzle-orm'

// Sign-in tries are reserved in PostgreSQL before the password is checked, so parallel tries
// (or several app servers) can never pass the limit. Two counters per try:
//  - the account at this address (`acct:<email>|<ip>`): a few failures, then a pause for that
//    pair only, so one person's typos or one guesser lock nobody else out;
//  - the address (`ip:<ip>`): a much higher bound over the same window, against one address
//    trying many accounts.
// A failure keeps its reservation; a success gives both back (and forgets the account's count).

export type LoginAttempt = { accountKey: string, addressKey: string, accountCount: number }

const accountKeyOf = (email: string, ip: string) => `acct:${email.toLowerCase()}|${ip}`
const addressKeyOf = (ip: string) => `ip:${ip}`

function limits() {
  const c = useRuntimeConfig()
  return {
    perAccount: Number(c.loginMaxFailures),
    perAddress: Number(c.loginMaxFailuresPerAddress),
    windowSecs: Number(c.loginLockMinutes) * 60,
  }
}

/** The client's address; behind a load balancer (`NUXT_TRUST_PROXY=true`) the first X-Forwarded-For hop. */
export function clientAddress(event: H3Event): string {
  const trustProxy = String(useRuntimeConfig().trustProxy) === 'true'
  return getRequestIP(event, { xForwardedFor: trustProxy }) ?? 'unknown'
}

// A counter starts over once its pause is over, or, without a pause, once its window has passed.
const fresh = (windowSecs: number) => sql`(
  (a.locked_until IS NOT NULL AND a.locked_until <= now())
  OR (a.locked_until IS NULL AND a.window_started_at <= now() - make_interval(secs => ${windowSecs})))`
const room = (max: number) => sql`(a.failures < ${max} AND (a.locked_until IS NULL OR a.locked_until <= now()))`

function reserveSql(key: string, max: number, windowSecs: number, after?: string) {
  const source = after ? sql`SELECT ${key}, 1, now(), now() FROM ${sql.raw(after)}` : sql`VALUES (${key}, 1, now(), now())`
  return sql`INSERT INTO login_attempts AS a (key, failures, window_started_at, last_failure_at) ${source}
    ON CONFLICT (key) DO UPDATE SET
      failures = CASE WHEN ${fresh(windowSecs)} THEN 1 ELSE a.failures + 1 END,
      window_started_at = CASE WHEN ${fresh(windowSecs)} THEN now() ELSE a.window_started_at END,
      locked_until = CASE WHEN ${fresh(windowSecs)} THEN NULL ELSE a.locked_until END,
      last_failure_at = now()
    WHERE ${fresh(windowSecs)} OR ${room(max)}
    RETURNING a.failures`
}

/**
 * Reserves one try for the address and for the account at that address, in one statement: the
 * address first, the account only if the address had room. Answers 429 with Retry-After when
 * either is used up (giving back what was taken); otherwise the reservation and how many tries
 * the account has used, for slowing the answer.
 */
export async function reserveLoginAttempt(event: H3Event, email: string, ip: string): Promise<LoginAttempt> {
  const { perAccount, perAddress, windowSecs } = limits()
  const accountKey = accountKeyOf(email, ip)
  const addressKey = addressKeyOf(ip)
  const db = useDb()
  const { rows } = await db.execute<{ address: number | null, account: number | null }>(sql`
    WITH addr AS (${reserveSql(addressKey, perAddress, windowSecs)}),
    acct AS (${reserveSql(accountKey, perAccount, windowSecs, 'addr')})
    SELECT (SELECT failures FROM addr) AS address, (SELECT failures FROM acct) AS account`)
  const got = rows[0]
  if (got?.address != null && got.account != null) return { accountKey, addressKey, accountCount: Number(got.account) }

  // Refused: the address's reservation (if taken) goes back, so tries at a paused account never
  // use up the address's bound for the others behind it.
  if (got?.address != null) await db.execute(sql`UPDATE login_attempts SET failures = greatest(failures - 1, 0) WHERE key = ${addressKey}`)
  const refusedBy = got?.address == null ? addressKey : accountKey
  const { rows: waits } = await db.execute<{ secs: number }>(sql`
    SELECT ceil(extract(epoch FROM coalesce(locked_until, window_started_at + make_interval(secs => ${windowSecs})) - now()))::int AS secs
    FROM login_attempts WHERE key = ${refusedBy}`)
  const retryAfter = Math.max(1, Number(waits[0]?.secs) || 0)
  setResponseHeader(event, 'retry-after', retryAfter)
  const message = 'Too many sign-in tries; try again later'
  throw createError({ status: 429, statusText: message, message, data: { retryAfter } })
}

/** A wrong pair: the reservation stays as a failure; a counter that reached its bound pauses. */
export async function recordLoginFailure(attempt: LoginAttempt) {
  const { perAccount, perAddress, windowSecs } = limits()
  await useDb().execute(sql`
    UPDATE login_attempts SET locked_until = now() + make_interval(secs => ${windowSecs})
    WHERE locked_until IS NULL AND (
      (key = ${attempt.accountKey} AND failures >= ${perAccount}) OR (key = ${attempt.addressKey} AND failures >= ${perAddress}))`)
}

/** Signed in: the account's count is forgotten and the address gets its try back. */
export async function recordLoginSuccess(attempt: LoginAttempt) {
  await useDb().execute(sql`
    WITH gone AS (DELETE FROM login_attempts WHERE key = ${attempt.accountKey})
    UPDATE login_attempts SET failures = greatest(failures - 1, 0) WHERE key = ${attempt.addressKey}`)
}

/** How long to hold a wrong-pair answer: a little more for each try the account has used. */
export function loginDelayMs(attempt: LoginAttempt) {
  return Math.min(Math.max(0, attempt.accountCount - 1) * 250, 2000)
}
