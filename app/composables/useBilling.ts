export const BILLING_READY_KEY = 'billing-ready'
export const INVOICES_KEY = 'billing-invoices'
export const invoiceKey = (id: string) => `invoice-${id}`

export function useBilling() {
  async function draft(callId: string) {
    const inv = await $fetch<{ id: string }>('/api/invoices', { method: 'POST', body: { callId } })
    await Promise.all([refreshNuxtData(BILLING_READY_KEY), refreshNuxtData(INVOICES_KEY)])
    return inv
  }
  async function send(id: string) {
    await $fetch(`/api/invoices/${id}/send`, { method: 'POST', body: {} })
    await refreshNuxtData(invoiceKey(id))
  }
  return { draft, send }
}
