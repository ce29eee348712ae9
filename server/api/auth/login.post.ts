import { eq, sql } from 'drizzle-orm'
import { loginSchema } from '#shared/schemas/auth'

// One message for every bad pair, so the answer never tells which e-mails exist.
const BAD_PAIR = 'E-mail or password is not right'
// Verified against when the e-mail is unknown, so both cases take the same time.
let decoyHash: Promise<string> | undefined

export default defineEventHandler(async (event) => {
  const { email, password } = await readValidatedBody(event, validateWith(loginSchema))
  // The try is reserved before the password is checked: parallel tries cannot pass the limit.
  const attempt = await reserveLoginAttempt(event, email, clientAddress(event))
  const delay = loginDelayMs(attempt)
  if (delay) await new Promise(r => setTimeout(r, delay))

  const user = await useDb().query.users.findFirst({ where: eq(sql`lower(${tables.users.email})`, email) })
  decoyHash ??= hashPassword('wayside-decoy-password')
  const ok = await verifyPassword(user?.passwordHash ?? await decoyHash, password)
  if (!user || !ok || !user.active) {
    await recordLoginFailure(attempt)
    throw createError({ status: 401, statusText: BAD_PAIR, message: BAD_PAIR })
  }
  await recordLoginSuccess(attempt)
  const sessionUser = { id: user.id, email: user.email, name: user.name, role: user.role }
  await startSession(event, sessionUser)
  return { user: sessionUser }
})
