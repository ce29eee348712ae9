// The mechanic's own shift, for the phone's Start shift / End shift button.
export default defineEventHandler(async (event) => {
  const me = await requireRole(event, 'mechanic')
  const row = await mechanicDuty(me.id)
  if (!row) throw createError({ status: 404, statusText: 'No such person' })
  return { onDuty: row.onDuty }
})
