// The phone's estimate of a call: the record as the phone keeps it (clock, parts, the rates and truck
// stock the last sync brought), turned into the same record the server prices the invoice draft from
// (shared/utils/estimate.ts), so both come to the same cents. Works with no signal.
import { billingRatesOf } from '#shared/utils/billing'
import { estimateRecordOfRows, type EstimateRecord } from '#shared/utils/estimate'
import type { CallView } from '~/stores/field'
import { readLibrary, readRates, type PulledRates } from './syncApply'

type StockRow = { truckId?: string, partNumber?: string, unitPriceCents?: number, coreChargeCents?: number }
type TruckRow = { id: string, yardLat?: number | null, yardLon?: number | null }

/** What the estimate needs from the device's library: the rates in force, the trucks' yards, their stock. */
export type EstimateBasis = { rates: PulledRates | undefined, trucks: Record<string, TruckRow>, stock: StockRow[] }

export async function readEstimateBasis(): Promise<EstimateBasis> {
  const [rates, trucks, stock] = await Promise.all([
    readRates(),
    readLibrary<Record<string, TruckRow>>('serviceTrucks').catch(() => undefined),
    readLibrary<StockRow[] | Record<string, StockRow>>('truckStock').catch(() => undefined),
  ])
  return { rates, trucks: trucks ?? {}, stock: Array.isArray(stock) ? stock : Object.values(stock ?? {}) }
}

/** The call's record for pricing, or null when the phone has no rates yet (never synced). */
export function fieldEstimateRecord(view: CallView, basis: EstimateBasis, now: Date): EstimateRecord | null {
  if (!basis.rates) return null
  const call = view.call
  const truckId = typeof call.serviceTruckId === 'string' ? call.serviceTruckId : null
  const truck = truckId ? basis.trucks[truckId] : undefined
  const yard = truck && truck.yardLat != null && truck.yardLon != null ? { lat: truck.yardLat, lon: truck.yardLon } : null
  // A part typed without a price takes the truck's, as the server does when it arrives.
  const stockPrice = (truck: unknown, partNumber: unknown) =>
    basis.stock.find(s => s.truckId === truck && s.partNumber === partNumber)
  const done = call.completedAt && ['completed', 'invoiced', 'paid'].includes(String(call.status)) ? String(call.completedAt) : null
  return estimateRecordOfRows({
    rates: billingRatesOf(basis.rates),
    site: { lat: call.lat ?? null, lon: call.lon ?? null },
    clock: view.clockEvents.flatMap(c => (c.kind
      ? [{ id: c.id, kind: c.kind, deviceAt: c.deviceAt, createdAt: c.createdAt, flag: c.flag }]
      : [])),
    parts: view.partLines.flatMap((p) => {
      if (!p.partNumber || !p.description || typeof p.quantity !== 'number') return []
      const s = p.serviceTruckId ? stockPrice(p.serviceTruckId, p.partNumber) : undefined
      return [{
        id: p.id, partNumber: p.partNumber, description: p.description, quantity: p.quantity,
        unitPriceCents: p.unitPriceCents ?? s?.unitPriceCents ?? 0, coreChargeCents: p.coreChargeCents ?? s?.coreChargeCents ?? 0,
      }]
    }),
    yard,
    taxExempt: view.customer?.taxExempt === true,
    until: done ?? now,
  })
}

/** The newest request with no answer yet, or undefined. */
export function openRequest(view: CallView) {
  const answered = new Set(view.approvals.map(a => a.requestId))
  return [...view.approvalRequests].reverse().find(r => !answered.has(r.id))
}

/** The fleet's newest answer on the phone, or undefined. */
export function latestAnswer(view: CallView) {
  return [...view.approvals].sort((a, b) => String(a.decidedAt ?? '').localeCompare(String(b.decidedAt ?? ''))).at(-1)
}
