import type { InjectionKey } from 'vue'
import type { StockCountInput, StockLineCreateInput, StockTransferInput, TruckCreateInput, TruckPatchInput } from '#shared/schemas/stock'

/** What the trucks screen reloads after a change: the list, and the open truck's stock and log. */
export const TRUCKS_RELOAD: InjectionKey<{ list: () => Promise<unknown>, truck?: () => Promise<unknown> }> = Symbol('trucks-reload')

/** The admin's changes to trucks and their stock; each reloads what it changed. */
export function useTrucks() {
  const reload = inject(TRUCKS_RELOAD, { list: async () => {} })
  const again = () => Promise.all([reload.list(), reload.truck?.()])

  async function addTruck(input: TruckCreateInput) {
    const truck = await $fetch('/api/service-trucks', { method: 'POST', body: input })
    await reload.list()
    return truck
  }
  async function changeTruck(id: string, patch: TruckPatchInput) {
    await $fetch(`/api/service-trucks/${id}`, { method: 'PATCH', body: patch })
    await reload.list()
  }
  async function addLine(truckId: string, input: StockLineCreateInput) {
    await $fetch(`/api/service-trucks/${truckId}/stock`, { method: 'POST', body: input })
    await again()
  }
  async function countLine(stockId: string, input: StockCountInput) {
    await $fetch(`/api/stock/${stockId}/count`, { method: 'POST', body: input })
    await again()
  }
  async function transfer(input: StockTransferInput) {
    await $fetch('/api/stock/transfers', { method: 'POST', body: input })
    await again()
  }
  return { addTruck, changeTruck, addLine, countLine, transfer }
}
