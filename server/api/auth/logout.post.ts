// Signing out ends this person's sessions on every device, not only this cookie.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  await endSessionsOf(user.id)
  await clearUserSession(event)
  return { ok: true }
})
