// The billing desk: finished calls and drafts, with what a clerk must look at first.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'office', 'admin')
  return { items: await listDesk() }
})
