// The roadside estimate: what a call comes to so far and with the work still needed, priced by the
// one pricing function (priceCall) from the same record the invoice draft is priced from. The phone
// builds its input from what it keeps offline and the server from the database, both through
// pricingInputOf, so the two agree to the cent.
import { haversineKm } from './geo'
import {
  priceCall, type BillingPart, type BillingRates, type PricedInvoice, type PricedLine, type PricingInput,
} from './billing'
import type { BillingClockEvent } from './clockSpans'

/** Where the estimate warns (share of the authorization limit, percent) and where it stops and asks. */
export const LIMIT_WARN_PCT = 80
export const LIMIT_STOP_PCT = 100

/** The record a call is priced from, as either side holds it. */
export type EstimateRecord = {
  rates: BillingRates
  clock: BillingClockEvent[]
  parts: BillingPart[]
  /** The service truck's yard and the call, when both are known; travel by distance is out and back between them. */
  yard: { lat: number, lon: number } | null
  site: { lat: number | null, lon: number | null }
  taxExempt: boolean
  /** An open clock span counts up to here: the call's completion, or now. */
  until: string | Date
}

/** Work still needed, priced as if it starts at `until`. */
export type EstimatePlan = {
  laborMinutes: number
  parts: Omit<BillingPart, 'id'>[]
}

/** Out and back between the yard and the call, as the crow flies, in km; null when either end is unknown. */
export function straightKmOf(yard: EstimateRecord['yard'], site: EstimateRecord['site']): number | null {
  if (!yard || site.lat == null || site.lon == null) return null
  return 2 * haversineKm(yard, { lat: site.lat, lon: site.lon })
}

/** The pricing input of a record: the invoice draft's (no plan) or the estimate's (with the work still needed). */
export function pricingInputOf(r: EstimateRecord, plan?: EstimatePlan): PricingInput {
  const until = new Date(r.until).toISOString()
  const planned = plan && plan.laborMinutes > 0 ? [{ kind: 'labor' as const, start: until, minutes: plan.laborMinutes }] : []
  return {
    rates: r.rates,
    clock: r.clock.map(c => ({ ...(c.id ? { id: c.id } : {}), kind: c.kind, at: new Date(c.at).toISOString(), flag: c.flag ?? null })),
    clockUntil: until,
    ...(planned.length ? { planned } : {}),
    distance: { straightKm: straightKmOf(r.yard, r.site), roadKm: null },
    parts: [...r.parts, ...(plan?.parts ?? []).map(p => ({ ...p }))],
    taxExempt: r.taxExempt,
  }
}

export type LimitState = 'none' | 'ok' | 'warn' | 'stop'

/** Where a total stands against the limit: no limit set, under 80 %, from 80 %, from 100 %. */
export function limitState(totalCents: number, limitCents: number | null | undefined): { state: LimitState, pct: number | null } {
  if (limitCents == null) return { state: 'none', pct: null }
  if (limitCents <= 0) return { state: totalCents > 0 ? 'stop' : 'ok', pct: totalCents > 0 ? Infinity : 0 }
  const pct = (totalCents * 100) / limitCents
  return { state: pct >= LIMIT_STOP_PCT ? 'stop' : pct >= LIMIT_WARN_PCT ? 'warn' : 'ok', pct }
}

export type Estimate = {
  /** What the record comes to now: the invoice draft's figures. */
  sofar: PricedInvoice
  /** With the work still needed (equal to `sofar` without a plan). */
  expected: PricedInvoice
  limitCents: number | null
  /** Against the limit: the expected total. */
  limit: ReturnType<typeof limitState>
}

/** The live estimate: so far, expected with the plan, and where it stands against the limit. */
export function estimateCall(r: EstimateRecord, limitCents: number | null, plan?: EstimatePlan): Estimate {
  const sofar = priceCall(pricingInputOf(r))
  const expected = plan && (plan.laborMinutes > 0 || plan.parts.length) ? priceCall(pricingInputOf(r, plan)) : sofar
  return { sofar, expected, limitCents, limit: limitState(expected.totalCents, limitCents) }
}

/** One approval, or the limit the call was taken with. */
export type CoverStep = { id: string | null, amountCents: number, label: string }
export type CoveredLine = PricedLine & { withTaxCents: number, runningCents: number, coveredBy: CoverStep | null }

/**
 * Which approval covers each line. Lines are taken in the invoice's order, each with its share of
 * tax; a line is covered by the first limit (the one the call was taken with, then each approval in
 * turn) that the running total stays within. A line past the last one is covered by none: work
 * recorded past what the fleet approved, for the clerk to see.
 */
export function approvalCoverage(
  priced: Pick<PricedInvoice, 'lines' | 'totalCents'>, taxRateBasisPoints: number, steps: CoverStep[],
): { lines: CoveredLine[], pastCents: number, approvedCents: number | null } {
  const limits = [...steps].sort((a, b) => a.amountCents - b.amountCents)
  let running = 0
  const lines = priced.lines.map((l) => {
    const withTaxCents = l.amountCents + (l.taxable ? Math.round((l.amountCents * taxRateBasisPoints) / 10_000) : 0)
    running += withTaxCents
    const coveredBy = limits.find(s => running <= s.amountCents) ?? null
    return { ...l, withTaxCents, runningCents: running, coveredBy }
  })
  const approvedCents = limits.length ? limits.at(-1)!.amountCents : null
  return { lines, pastCents: approvedCents == null ? 0 : Math.max(0, priced.totalCents - approvedCents), approvedCents }
}

type When = string | Date
/** A clock event or part line as either side keeps it: the server's rows (dates) or the phone's (ISO text). */
export type EstimateRows = {
  site: { lat?: number | null, lon?: number | null }
  clock: { id?: string, kind: BillingClockEvent['kind'], deviceAt?: When | null, createdAt?: When | null, flag?: string | null }[]
  parts: {
    id?: string
    partNumber: string
    description: string
    quantity: number
    unitPriceCents?: number | null
    coreChargeCents?: number | null
  }[]
  rates: BillingRates
  yard: { lat: number, lon: number } | null
  taxExempt: boolean
  until: When
}

/** The record from rows: a clock event at the phone's time (else when the server took it), a part without a price at 0. */
export function estimateRecordOfRows(r: EstimateRows): EstimateRecord {
  const iso = (w: When) => new Date(w).toISOString()
  return {
    rates: r.rates,
    clock: r.clock.flatMap((c) => {
      const at = c.deviceAt ?? c.createdAt
      return at ? [{ ...(c.id ? { id: c.id } : {}), kind: c.kind, at: iso(at), flag: c.flag ?? null }] : []
    }),
    parts: r.parts.map(p => ({
      ...(p.id ? { id: p.id } : {}), partNumber: p.partNumber, description: p.description, quantity: p.quantity,
      unitPriceCents: p.unitPriceCents ?? 0, coreChargeCents: p.coreChargeCents ?? 0,
    })),
    yard: r.yard,
    site: { lat: r.site.lat ?? null, lon: r.site.lon ?? null },
    taxExempt: r.taxExempt,
    until: iso(r.until),
  }
}
