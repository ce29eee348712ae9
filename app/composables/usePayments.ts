import type { CreditNoteInput, PaymentRecordInput, RefundInput } from '#shared/schemas/payments'

/** Money on an invoice from the office's pages; each call carries the intent's idempotency key. */
export function usePayments() {
  const refreshKeys = useRefreshKeys()
  async function post(path: string, body: object, key: string, invoiceId: string) {
    try {
      return await $fetch(path, { method: 'POST', body, headers: { 'Idempotency-Key': key } })
    }
    finally { await refreshKeys(invoiceKey(invoiceId)) }
  }
  return {
    pay: (id: string, input: PaymentRecordInput, key: string) => post(`/api/invoices/${id}/pay`, input, key, id),
    refund: (id: string, input: RefundInput, key: string) => post(`/api/invoices/${id}/refunds`, input, key, id),
    creditNote: (id: string, input: CreditNoteInput, key: string) => post(`/api/invoices/${id}/credit-notes`, input, key, id),
  }
}
