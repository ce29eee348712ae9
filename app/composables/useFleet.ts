import type { CustomerCreateInput, CustomerPatchInput, SiteCreateInput } from '#shared/schemas/customers'
import type { UnitCreateInput, UnitPatchInput } from '#shared/schemas/units'

export const CUSTOMERS_KEY = 'fleet-customers'
export const UNITS_KEY = 'fleet-units'
export const customerKey = (id: string) => `customer-${id}`
export const unitKey = (id: string) => `unit-${id}`

/** Writes for customers, their yards and units; each refreshes what shows them. */
export function useFleet() {
  const refreshKeys = useRefreshKeys()
  async function addCustomer(input: CustomerCreateInput) {
    const row = await $fetch<{ id: string, name: string }>('/api/customers', { method: 'POST', body: input })
    await refreshKeys(CUSTOMERS_KEY)
    return row
  }
  async function changeCustomer(id: string, patch: CustomerPatchInput) {
    await $fetch(`/api/customers/${id}`, { method: 'PATCH', body: patch })
    await refreshKeys([CUSTOMERS_KEY, customerKey(id)])
  }
  async function addSite(customerId: string, input: SiteCreateInput) {
    await $fetch(`/api/customers/${customerId}/sites`, { method: 'POST', body: input })
    await refreshKeys(customerKey(customerId))
  }
  async function addUnit(input: UnitCreateInput) {
    const row = await $fetch<{ id: string, unitNumber: string }>('/api/units', { method: 'POST', body: input })
    await refreshKeys([UNITS_KEY, customerKey(input.customerId)])
    return row
  }
  async function changeUnit(id: string, patch: UnitPatchInput) {
    await $fetch(`/api/units/${id}`, { method: 'PATCH', body: patch })
    await refreshKeys([UNITS_KEY, unitKey(id)])
  }
  return { addCustomer, changeCustomer, addSite, addUnit, changeUnit }
}

/** A 409 answer's record as it is now, or undefined for any other failure. */
export function staleRecord<T = any>(err: any): T | undefined {
  const status = err?.statusCode ?? err?.response?.status
  return status === 409 ? (err?.data?.data?.current as T) : undefined
}
