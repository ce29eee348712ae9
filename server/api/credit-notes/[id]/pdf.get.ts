import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const note = await getCreditNote(id)
  if (!note) throw createError({ status: 404, statusText: 'No such credit note' })
  const pdf = await renderCreditNotePdf(note)
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': `inline; filename="credit-note-CN-${note.number}.pdf"`,
    'cache-control': 'private, no-store',
  })
  return pdf
})
