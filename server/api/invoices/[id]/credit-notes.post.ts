import { creditNoteSchema } from '#shared/schemas/payments'
import { idParamsSchema } from '#shared/schemas/users'

// Corrects an invoice already sent with a credit note of its own number, once per intent.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const input = await readValidatedBody(event, validateWith(creditNoteSchema))
  const key = readIdempotencyKey(event, input.idempotencyKey)
  const creditNote = await issueCreditNote(id, input, key, user)
  setResponseStatus(event, creditNote.replayed ? 200 : 201)
  return { ...(await getInvoice(id))!, creditNote }
})
