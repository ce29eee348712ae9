// What a production start must not run with: the secrets the local scripts use, and the local
// fakes' addresses. `npm start`, `npm test`, `npm run dev` and `npm run bench` mark themselves
// with WAYSIDE_LOCAL=1; any other start with NODE_ENV=production is checked here and refused,
// naming the variable to set, before it serves anything.

/** Session passwords written into scripts/test.sh and scripts/bench.sh: public, so never for real use. */
export const LOCAL_SESSION_PASSWORDS = [
  'wayside-test-session-password-0123456789abcdef',
  'wayside-bench-session-password-0123456789abcdef',
]
const LOCAL_STRIPE_KEYS = ['sk_test_wayside_local', 'whsec_wayside_local']
const LOCAL_DATABASE_URL = 'postgres://wayside@127.0.0.1:54329/wayside'
// The object-store fake's keys (scripts/fakes/s3-fake.ts, s3rver's defaults).
const S3_FAKE_KEY = 'S3RVER'

const isLoopback = (host: string) => /^(127\.\d+\.\d+\.\d+|localhost|::1|\[::1\]|0\.0\.0\.0)$/i.test(host.trim())
// The SMTP catcher listens on 2525 (npm start) and 2600+10·slot (tests, benchmarks).
const isFakeSmtpPort = (port: number) => port === 2525 || (port >= 2600 && port < 2700)

export type StartSettings = {
  sessionPassword: string | undefined
  cookieSecure: unknown
  databaseUrl: string
  smtpHost: string
  smtpPort: number
  stripeSecretKey: string
  stripeWebhookSecret: string
  stripeApiHost: string
  stripeApiProtocol: string
  siteUrl: string
  /** Photo storage: checked only when a bucket is named (without one, photos stay in a folder). */
  uploadsS3Bucket?: string
  uploadsS3Endpoint?: string
  uploadsS3AccessKeyId?: string
}

/** Every problem with these settings for a production start, each naming the variable to set. */
export function productionProblems(s: StartSettings): string[] {
  const out: string[] = []
  const pw = s.sessionPassword ?? ''
  const newSecret = 'set a secret of your own (openssl rand -hex 32)'
  if (pw.length < 32) out.push(`NUXT_SESSION_PASSWORD: at least 32 characters; ${newSecret}`)
  else if (LOCAL_SESSION_PASSWORDS.includes(pw) || /^wayside-(test|bench)-/.test(pw)) {
    out.push(`NUXT_SESSION_PASSWORD: this is the local test password, published in scripts/; ${newSecret}`)
  }
  if (String(s.cookieSecure) !== 'true') {
    out.push('NUXT_SESSION_COOKIE_SECURE: session cookies must be Secure behind HTTPS; set it to true (or leave it unset)')
  }
  if (s.databaseUrl === LOCAL_DATABASE_URL) {
    out.push('NUXT_DATABASE_URL: still the local development cluster; set the production database\'s URL')
  }
  if (isLoopback(s.smtpHost) && isFakeSmtpPort(Number(s.smtpPort))) {
    out.push(`NUXT_SMTP_HOST / NUXT_SMTP_PORT: ${s.smtpHost}:${s.smtpPort} is the local mail catcher; set your mail server`)
  }
  if (LOCAL_STRIPE_KEYS.includes(s.stripeSecretKey)) {
    out.push('NUXT_STRIPE_SECRET_KEY: still the local fake\'s key; set the payment provider\'s secret key')
  }
  if (LOCAL_STRIPE_KEYS.includes(s.stripeWebhookSecret)) {
    out.push('NUXT_STRIPE_WEBHOOK_SECRET: still the local fake\'s secret; set the webhook signing secret')
  }
  if (isLoopback(s.stripeApiHost) || s.stripeApiProtocol !== 'https') {
    const where = `${s.stripeApiProtocol}://${s.stripeApiHost}`
    out.push(`NUXT_STRIPE_API_HOST / NUXT_STRIPE_API_PROTOCOL: ${where} is the local payment fake; set the provider's API host over https`)
  }
  if (s.uploadsS3Bucket && (s3FakeProblem(s.uploadsS3Endpoint ?? '') || s.uploadsS3AccessKeyId === S3_FAKE_KEY)) {
    out.push(`NUXT_UPLOADS_S3_ENDPOINT / NUXT_UPLOADS_S3_ACCESS_KEY_ID: ${s.uploadsS3Endpoint || '(unset)'} with the fake's keys `
      + 'is the local object-store fake; set your object storage\'s address and keys')
  }
  if (!siteUrlProblem(s.siteUrl)) return out
  out.push(`NUXT_SITE_URL: ${s.siteUrl || '(unset)'} ${siteUrlProblem(s.siteUrl)}; set the https address payers and fleets open`)
  return out
}

// Links in e-mail and QR codes (the payment page, the fleet's status link) are built on it.
function siteUrlProblem(url: string): string | null {
  let u: URL
  try {
    u = new URL(url)
  }
  catch {
    return 'is not an address'
  }
  if (isLoopback(u.hostname)) return 'points at this machine, which no payer or fleet can reach'
  if (u.protocol !== 'https:') return 'is not https'
  return null
}

// A bucket on this machine (the fake), or no address at all.
function s3FakeProblem(endpoint: string): boolean {
  try {
    return isLoopback(new URL(endpoint).hostname)
  }
  catch {
    return true
  }
}

/** Whether this start is a production one: NODE_ENV=production, not marked local by the scripts. */
export function isProductionStart(env: Record<string, string | undefined> = process.env): boolean {
  // Read by name at run time: the build replaces the literal process.env.NODE_ENV with "production".
  const nodeEnv = env['NODE_ENV']
  return nodeEnv === 'production' && env.WAYSIDE_LOCAL !== '1'
}
