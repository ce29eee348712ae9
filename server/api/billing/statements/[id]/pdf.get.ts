import { idParamsSchema } from '#shared/schemas/users'

// A customer's statement of account as a PDF, as of now.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const statement = await customerStatement(id)
  if (!statement) throw createError({ status: 404, statusText: 'No such customer' })
  const pdf = await renderStatementPdf(statement)
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': `inline; filename="${statementFilename(statement)}"`,
    'cache-control': 'private, no-store',
  })
  return pdf
})
