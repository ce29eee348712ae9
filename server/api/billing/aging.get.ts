// What each fleet owes, by days past due.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'office', 'admin')
  return { rows: await agingRows() }
})
