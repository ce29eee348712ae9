import { restockQuerySchema } from '#shared/schemas/stock'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'office', 'admin')
  const { truckId } = await getValidatedQuery(event, validateWith(restockQuerySchema))
  const rows = await restockList(truckId)
  return sendCsv(event, `restock-${new Date().toISOString().slice(0, 10)}.csv`, writeCsv(RESTOCK_COLUMNS, rows))
})
