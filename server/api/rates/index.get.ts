// Every signed-in person reads the rates in force (the phone caches them for offline use).
export default defineEventHandler(async (event) => {
  await requireUser(event)
  return { rates: await ratesInForce() }
})
