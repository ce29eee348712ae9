// Pricing a road call from its synced record. Money is integer cents throughout; labor is billed
// in tenths of an hour rounded UP (a started six minutes is a billed tenth, shop policy stated on
// the invoice); rates come from the admin's rates row.

export type BillingRates = {
  laborCentsPerHour: number
  minimumLaborTenths: number
  roadCallMinimumCents: number
  travelCentsPerUnit: number
  travelUnit: 'km' | 'mi'
  partsMarkupPct: number
  taxRateBasisPoints: number
  laborTaxable: boolean
}

export type ClockKind = 'travel_start' | 'arrive' | 'work_start' | 'work_stop' | 'depart'
export type BillingClockEvent = { kind: ClockKind, at: string | Date }
export type BillingPart = { partNumber: string, description: string, quantity: number, unitPriceCents: number, coreChargeCents: number }
export type InvoiceLineKind = 'labor' | 'travel' | 'minimum' | 'part' | 'core' | 'fee'
export type PricedLine = { kind: InvoiceLineKind, description: string, quantity: number, unitCents: number, amountCents: number, taxable: boolean }
export type PricedInvoice = { lines: PricedLine[], subtotalCents: number, taxCents: number, totalCents: number }

const MS_PER_TENTH = 6 * 60 * 1000

function assertCents(name: string, v: number) {
  if (!Number.isInteger(v) || v < 0) throw new RangeError(`${name} must be a whole, non-negative number of cents (got ${v})`)
}

/** Hours in tenths, rounded up: 6 min → 1, 7 min → 2, 0 → 0. */
export function laborTenthsFromMs(ms: number): number {
  if (!Number.isFinite(ms) || ms < 0) throw new RangeError(`time must be a non-negative number of milliseconds (got ${ms})`)
  // Tolerate float noise from date arithmetic so exactly 0.3 h does not become 0.4 h.
  return Math.max(0, Math.ceil(ms / MS_PER_TENTH - 1e-9))
}

/**
 * Travel and labor time from the clock events, in order of time. Travel runs from travel_start to
 * arrive; labor from each work_start to the next work_stop. An open span (no stop yet) counts up
 * to `now`, so a running clock shows what has accrued so far.
 */
export function clockTotals(events: BillingClockEvent[], now: Date = new Date()): { travelMs: number, laborMs: number } {
  const sorted = events.map(e => ({ kind: e.kind, t: new Date(e.at).getTime() }))
  for (const e of sorted) if (!Number.isFinite(e.t)) throw new RangeError(`clock event ${e.kind} has no valid time`)
  sorted.sort((a, b) => a.t - b.t)
  let travelMs = 0, laborMs = 0
  let travelFrom: number | null = null, workFrom: number | null = null
  for (const e of sorted) {
    if (e.kind === 'travel_start') travelFrom ??= e.t
    else if (e.kind === 'arrive' && travelFrom !== null) { travelMs += e.t - travelFrom; travelFrom = null }
    else if (e.kind === 'work_start') workFrom ??= e.t
    else if (e.kind === 'work_stop' && workFrom !== null) { laborMs += e.t - workFrom; workFrom = null }
    else if (e.kind === 'depart' && workFrom !== null) { laborMs += e.t - workFrom; workFrom = null }
  }
  const end = now.getTime()
  if (travelFrom !== null && end > travelFrom) travelMs += end - travelFrom
  if (workFrom !== null && end > workFrom) laborMs += end - workFrom
  return { travelMs, laborMs }
}

/** Half-up rounding to whole cents of a non-negative amount. */
function roundCents(x: number) { return Math.floor(x + 0.5 + 1e-9) }

/** A price marked up by a whole percentage, to the cent. */
export function markedUpCents(unitCents: number, markupPct: number): number {
  assertCents('unit price', unitCents)
  return roundCents(unitCents * (100 + markupPct) / 100)
}

export function priceCall(input: {
  rates: BillingRates
  laborMs: number
  /** Round-trip travel distance in the rates' unit (km or mi). */
  travelDistance: number
  parts: BillingPart[]
  taxExempt: boolean
}): PricedInvoice {
  const { rates } = input
  assertCents('labor rate', rates.laborCentsPerHour)
  assertCents('travel rate', rates.travelCentsPerUnit)
  assertCents('road-call minimum', rates.roadCallMinimumCents)
  if (!Number.isFinite(input.travelDistance) || input.travelDistance < 0) throw new RangeError('travel distance must be a non-negative number')
  const lines: PricedLine[] = []

  const actualTenths = laborTenthsFromMs(input.laborMs)
  const billedTenths = Math.max(actualTenths, rates.minimumLaborTenths)
  if (billedTenths > 0) {
    const hours = billedTenths / 10
    lines.push({
      kind: 'labor',
      description: actualTenths < billedTenths
        ? `Labor ${hours.toFixed(1)} h (minimum; ${(actualTenths / 10).toFixed(1)} h worked, billed in tenths rounded up)`
        : `Labor ${hours.toFixed(1)} h (billed in tenths of an hour, rounded up)`,
      quantity: hours, unitCents: rates.laborCentsPerHour,
      amountCents: roundCents(billedTenths * rates.laborCentsPerHour / 10), taxable: rates.laborTaxable,
    })
  }

  const distance = Math.round(input.travelDistance * 10) / 10
  if (distance > 0 && rates.travelCentsPerUnit > 0) {
    lines.push({
      kind: 'travel', description: `Travel ${distance.toFixed(1)} ${rates.travelUnit}, out and back`,
      quantity: distance, unitCents: rates.travelCentsPerUnit,
      amountCents: roundCents(distance * rates.travelCentsPerUnit), taxable: false,
    })
  }

  const callCharges = lines.reduce((s, l) => s + l.amountCents, 0)
  if (callCharges < rates.roadCallMinimumCents) {
    const top = rates.roadCallMinimumCents - callCharges
    lines.push({ kind: 'minimum', description: 'Road-call minimum charge (difference)', quantity: 1, unitCents: top, amountCents: top, taxable: rates.laborTaxable })
  }

  for (const p of input.parts) {
    if (!Number.isFinite(p.quantity) || p.quantity <= 0) throw new RangeError(`part ${p.partNumber}: quantity must be above zero`)
    assertCents(`part ${p.partNumber} core charge`, p.coreChargeCents)
    const unit = markedUpCents(p.unitPriceCents, rates.partsMarkupPct)
    lines.push({ kind: 'part', description: `${p.partNumber} ${p.description}`, quantity: p.quantity, unitCents: unit, amountCents: roundCents(unit * p.quantity), taxable: true })
    if (p.coreChargeCents > 0) {
      lines.push({ kind: 'core', description: `Core charge, ${p.partNumber} (refunded when the old part is returned)`, quantity: p.quantity, unitCents: p.coreChargeCents, amountCents: roundCents(p.coreChargeCents * p.quantity), taxable: false })
    }
  }

  if (input.taxExempt) for (const l of lines) l.taxable = false
  const subtotalCents = lines.reduce((s, l) => s + l.amountCents, 0)
  const taxableCents = lines.filter(l => l.taxable).reduce((s, l) => s + l.amountCents, 0)
  const taxCents = roundCents(taxableCents * rates.taxRateBasisPoints / 10_000)
  return { lines, subtotalCents, taxCents, totalCents: subtotalCents + taxCents }
}

/** "$1,234.56" for display; cents stay integers everywhere else. */
export function formatCents(cents: number, currency = 'USD'): string {
  return new Intl.NumberFormat('en-US', { style: 'currency', currency }).format(cents / 100)
}
