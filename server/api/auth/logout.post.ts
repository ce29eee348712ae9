export default defineEventHandler(async (event) => {
  await requireUser(event)
  await clearUserSession(event)
  return { ok: true }
})
