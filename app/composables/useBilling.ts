import type { InvoiceAdjustmentInput } from '#shared/schemas/invoices'

export const BILLING_READY_KEY = 'billing-ready'
export const INVOICES_KEY = 'billing-invoices'
export const BILLING_DESK_KEY = 'billing-desk'
export const invoiceKey = (id: string) => `invoice-${id}`

export function useBilling() {
  const refreshKeys = useRefreshKeys()
  async function draft(callId: string) {
    const inv = await $fetch<{ id: string }>('/api/invoices', { method: 'POST', body: { callId } })
    await refreshKeys([BILLING_READY_KEY, INVOICES_KEY, BILLING_DESK_KEY])
    return inv
  }
  async function send(id: string) {
    await $fetch(`/api/invoices/${id}/send`, { method: 'POST', body: {} })
    await refreshKeys(invoiceKey(id))
  }
  /** One change to a draft, with its reason; the page shows the repriced invoice. */
  async function adjust(id: string, input: InvoiceAdjustmentInput) {
    await $fetch(`/api/invoices/${id}/adjustments`, { method: 'POST', body: input })
    await refreshKeys([invoiceKey(id), BILLING_DESK_KEY])
  }
  return { draft, send, adjust }
}
