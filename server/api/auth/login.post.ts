import { eq, sql } from 'drizzle-orm'
import { loginSchema } from '#shared/schemas/auth'

// One message for every bad pair, so the answer never tells which e-mails exist.
const BAD_PAIR = 'E-mail or password is not right'
// Verified against when the e-mail is unknown, so both cases take the same time.
let decoyHash: Promise<string> | undefined

export default defineEventHandler(async (event) => {
  const { email, password } = await readValidatedBody(event, validateWith(loginSchema))
  const ip = getRequestIP(event) ?? 'unknown'
  const delay = await checkLoginAllowed(event, email, ip)
  if (delay) await new Promise(r => setTimeout(r, delay))

  const user = await useDb().query.users.findFirst({ where: eq(sql`lower(${tables.users.email})`, email) })
  decoyHash ??= hashPassword('wayside-decoy-password')
  const ok = await verifyPassword(user?.passwordHash ?? await decoyHash, password)
  if (!user || !ok || !user.active) {
    await recordLoginFailure(email, ip)
    throw createError({ status: 401, statusText: BAD_PAIR, message: BAD_PAIR })
  }
  await clearLoginFailures(email)
  const sessionUser = { id: user.id, email: user.email, name: user.name, role: user.role }
  await setUserSession(event, { user: sessionUser, loggedInAt: new Date().toISOString() })
  return { user: sessionUser }
})
