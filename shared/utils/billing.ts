// Pricing a road call from its record. One function, priceCall, prices the office's draft, every
// edit of it, the PDF and the phone's estimate of a call still in progress. Money is integer cents
// throughout; time is billed in tenths of an hour rounded UP (a started six minutes is a billed
// tenth, shop policy stated on the invoice); every rule comes from the admin's rates row.
import { splitByBusinessHours, type BusinessHours } from './businessHours'
import { clockSpans, type BillingClockEvent, type ClockKind, type Span } from './clockSpans'
import { formatCents } from './money'

export type TravelBasis = 'distance' | 'time'

export type BillingRates = BusinessHours & {
  laborCentsPerHour: number
  /** After-hours time is billed at this percentage of the normal rate (150 = time and a half). */
  afterHoursMultiplierPct: number
  minimumLaborTenths: number
  roadCallMinimumCents: number
  travelBasis: TravelBasis
  travelCentsPerUnit: number
  travelUnit: 'km' | 'mi'
  travelCentsPerHour: number
  /** Straight-line distance × this / 100 when the distance by road is not known. */
  roadFactorPct: number
  partsMarkupPct: number
  taxRateBasisPoints: number
  laborTaxable: boolean
  travelTaxable: boolean
  partsTaxable: boolean
  coresTaxable: boolean
  feesTaxable: boolean
  /** Shop supplies as a share of labor, in basis points, capped per invoice (null: no cap). */
  shopSuppliesBasisPoints: number
  shopSuppliesCapCents: number | null
  environmentalFeeCents: number
}

/** A clock event; `flag` is set when the phone's clock could not be trusted for it (never billed). */
export type BillingPart = {
  id?: string
  partNumber: string
  description: string
  quantity: number
  unitPriceCents: number
  coreChargeCents: number
}
export type InvoiceLineKind = 'labor' | 'travel' | 'minimum' | 'part' | 'core' | 'fee'
/** Time not yet on the clock (the phone's estimate): priced as if worked from `start`. */
export type PlannedSpan = { kind: 'labor' | 'travel', start: string | Date, minutes: number }

/** Where a line's figures come from: the clock events, the part line, the rate, or the office. */
export type LineSource = { rate?: keyof BillingRates, clockEventIds?: string[], partLineId?: string, planned?: boolean, office?: boolean }
export type LineFields = { kind: InvoiceLineKind, description: string, quantity: number, unitCents: number, taxable: boolean }
export type PricedLine = LineFields & { key: string, amountCents: number, source: LineSource, adjusted: boolean }

/** The office's changes to a draft, in the order they were made. */
export type PriceAdjustment
  = | { action: 'add', key: string, line: LineFields }
    | { action: 'change', key: string, changes: Partial<Omit<LineFields, 'kind'>> }
    | { action: 'remove', key: string }
  /** Out-and-back distance by road, in the rates' unit; replaces the straight-line estimate. */
    | { action: 'road', distance: number | null }

export type PricingInput = {
  rates: BillingRates
  clock: BillingClockEvent[]
  /** An open clock span counts up to here: the call's completion, or now for an estimate. */
  clockUntil: string | Date
  planned?: PlannedSpan[]
  /** Out and back between the yard and the call, in km: by road when known, else the straight line. */
  distance: { straightKm: number | null, roadKm?: number | null }
  parts: BillingPart[]
  taxExempt: boolean
  adjustments?: PriceAdjustment[]
}

export type PricedInvoice = {
  lines: PricedLine[]
  subtotalCents: number
  taxCents: number
  totalCents: number
  /** Clock events left out of the priced time because the phone's clock could not be trusted. */
  excludedClock: { id?: string, kind: ClockKind, at: string, flag: string }[]
  /** Changes that no longer match a line (a removed or never-made line), in input order. */
  unapplied: PriceAdjustment[]
}

type StoredRates = Omit<BillingRates, 'travelBasis' | 'travelUnit'> & { travelBasis: string, travelUnit: string }

/** The pricing's view of a stored rates row (or GET /api/rates' answer), whatever else it carries. */
export function billingRatesOf(r: StoredRates): BillingRates {
  return {
    laborCentsPerHour: r.laborCentsPerHour, afterHoursMultiplierPct: r.afterHoursMultiplierPct, minimumLaborTenths: r.minimumLaborTenths,
    roadCallMinimumCents: r.roadCallMinimumCents, travelBasis: r.travelBasis === 'time' ? 'time' : 'distance',
    travelCentsPerUnit: r.travelCentsPerUnit, travelUnit: r.travelUnit === 'mi' ? 'mi' : 'km', travelCentsPerHour: r.travelCentsPerHour,
    roadFactorPct: r.roadFactorPct, partsMarkupPct: r.partsMarkupPct, taxRateBasisPoints: r.taxRateBasisPoints,
    laborTaxable: r.laborTaxable, travelTaxable: r.travelTaxable, partsTaxable: r.partsTaxable,
    coresTaxable: r.coresTaxable, feesTaxable: r.feesTaxable,
    shopSuppliesBasisPoints: r.shopSuppliesBasisPoints, shopSuppliesCapCents: r.shopSuppliesCapCents,
    environmentalFeeCents: r.environmentalFeeCents,
    timeZone: r.timeZone, openMinute: r.openMinute, closeMinute: r.closeMinute, openDays: [...r.openDays], holidays: [...r.holidays],
  }
}

const MS_PER_TENTH = 6 * 60 * 1000
const KM_PER_MILE = 1.609344 // international mile, exact by definition

function assertCents(name: string, v: number) {
  if (!Number.isInteger(v) || v < 0) throw new RangeError(`${name} must be a whole, non-negative number of cents (got ${v})`)
}

/** Hours in tenths, rounded up: 6 min → 1, 7 min → 2, 0 → 0. */
export function laborTenthsFromMs(ms: number): number {
  if (!Number.isFinite(ms) || ms < 0) throw new RangeError(`time must be a non-negative number of milliseconds (got ${ms})`)
  // Tolerate float noise from date arithmetic so exactly 0.3 h does not become 0.4 h.
  return Math.max(0, Math.ceil(ms / MS_PER_TENTH - 1e-9))
}

/** Half-up rounding to whole cents of a non-negative amount. */
function roundCents(x: number) {
  return Math.floor(x + 0.5 + 1e-9)
}

/** A price marked up by a whole percentage, to the cent. */
export function markedUpCents(unitCents: number, markupPct: number): number {
  assertCents('unit price', unitCents)
  return roundCents(unitCents * (100 + markupPct) / 100)
}

const hoursText = (tenths: number) => `${(tenths / 10).toFixed(1)} h`
const pctText = (pct: number) => `${Number((pct / 100).toFixed(2))}`

/**
 * Billed tenths inside and after hours for some spans. The total is rounded up once; the started
 * tenth after hours is billed at the after-hours rate, the rest of the total at the normal rate.
 */
function splitTenths(spans: Span[], rates: BillingRates) {
  let inside = 0, after = 0
  for (const s of spans) {
    const part = splitByBusinessHours(s.start, s.end, rates)
    inside += part.insideMs
    after += part.afterMs
  }
  const total = laborTenthsFromMs(inside + after)
  const afterTenths = Math.min(total, laborTenthsFromMs(after))
  return { total, normal: total - afterTenths, after: afterTenths, ids: [...new Set(spans.flatMap(s => s.ids))] }
}

function line(key: string, f: LineFields, source: LineSource): PricedLine {
  return { key, ...f, amountCents: roundCents(f.quantity * f.unitCents), source, adjusted: false }
}

/** Time lines (labor, or travel by time): the normal-rate line and the after-hours line. */
function timeLines(
  kind: 'labor' | 'travel', spans: Span[], centsPerHour: number, minimumTenths: number, rates: BillingRates, planned: boolean,
): PricedLine[] {
  const t = splitTenths(spans, rates)
  const billed = Math.max(t.total, minimumTenths)
  const normal = t.normal + billed - t.total
  const taxable = kind === 'labor' ? rates.laborTaxable : rates.travelTaxable
  const rate = kind === 'labor' ? 'laborCentsPerHour' : 'travelCentsPerHour'
  const name = kind === 'labor' ? 'Labor' : 'Travel time'
  const source = (r: keyof BillingRates): LineSource => ({ rate: r, clockEventIds: t.ids, ...(planned ? { planned } : {}) })
  const out: PricedLine[] = []
  if (normal > 0) {
    const note = billed > t.total ? `minimum ${hoursText(billed)}; ${hoursText(t.total)} on the clock` : 'tenths of an hour, rounded up'
    const description = `${name} ${hoursText(normal)} (${note})`
    out.push(line(kind, { kind, description, quantity: normal / 10, unitCents: centsPerHour, taxable }, source(rate)))
  }
  if (t.after > 0) {
    const unit = roundCents(centsPerHour * rates.afterHoursMultiplierPct / 100)
    out.push(line(`${kind}:after`, {
      kind, description: `${name} after hours ${hoursText(t.after)} (${rates.afterHoursMultiplierPct} % of the normal rate)`,
      quantity: t.after / 10, unitCents: unit, taxable,
    }, source('afterHoursMultiplierPct')))
  }
  return out
}

function distanceLine(input: PricingInput, road: number | null | undefined): PricedLine[] {
  const { rates } = input
  const toUnit = (km: number) => (rates.travelUnit === 'mi' ? km / KM_PER_MILE : km)
  let distance: number, how: string
  if (road != null || input.distance.roadKm != null) {
    distance = road ?? toUnit(input.distance.roadKm!)
    how = 'by road'
  }
  else if (input.distance.straightKm != null) {
    distance = toUnit(input.distance.straightKm) * rates.roadFactorPct / 100
    how = `straight line × ${pctText(rates.roadFactorPct)} for the road`
  }
  else return []
  if (!Number.isFinite(distance) || distance < 0) throw new RangeError('travel distance must be a non-negative number')
  const quantity = Math.round(distance * 10) / 10
  if (quantity <= 0 || rates.travelCentsPerUnit <= 0) return []
  return [line('travel', {
    kind: 'travel', description: `Travel ${quantity.toFixed(1)} ${rates.travelUnit}, out and back (${how})`,
    quantity, unitCents: rates.travelCentsPerUnit, taxable: rates.travelTaxable,
  }, { rate: 'travelCentsPerUnit' })]
}

function partLines(input: PricingInput): PricedLine[] {
  const { rates } = input
  const out: PricedLine[] = []
  input.parts.forEach((p, i) => {
    if (!Number.isFinite(p.quantity) || p.quantity <= 0) throw new RangeError(`part ${p.partNumber}: quantity must be above zero`)
    assertCents(`part ${p.partNumber} core charge`, p.coreChargeCents)
    const ref = p.id ?? String(i)
    const src: LineSource = p.id ? { partLineId: p.id } : { planned: true }
    out.push(line(`part:${ref}`, {
      kind: 'part', description: `${p.partNumber} ${p.description}`, quantity: p.quantity,
      unitCents: markedUpCents(p.unitPriceCents, rates.partsMarkupPct), taxable: rates.partsTaxable,
    }, { ...src, rate: 'partsMarkupPct' }))
    if (p.coreChargeCents > 0) {
      out.push(line(`core:${ref}`, {
        kind: 'core', description: `Core charge, ${p.partNumber} (refunded when the old part is returned)`,
        quantity: p.quantity, unitCents: p.coreChargeCents, taxable: rates.coresTaxable,
      }, src))
    }
  })
  return out
}

function checkFields(f: Partial<LineFields>) {
  if (f.quantity !== undefined && (!Number.isFinite(f.quantity) || f.quantity <= 0)) throw new RangeError('quantity must be above zero')
  if (f.unitCents !== undefined) assertCents('unit price', f.unitCents)
}

/** Applies the office's changes to the lines whose keys they name; returns the ones that matched none. */
function applyAdjustments(lines: PricedLine[], adjustments: PriceAdjustment[], keys: (key: string) => boolean) {
  const missed: PriceAdjustment[] = []
  for (const a of adjustments) {
    if (a.action === 'road' || !keys(a.key)) continue
    const i = lines.findIndex(l => l.key === a.key)
    if (a.action === 'add') {
      checkFields(a.line)
      if (i >= 0) {
        missed.push(a)
        continue
      }
      lines.push({ ...line(a.key, a.line, { office: true }), adjusted: true })
    }
    else if (i < 0) missed.push(a)
    else if (a.action === 'remove') lines.splice(i, 1)
    else {
      checkFields(a.changes)
      const prev = lines[i]!
      const next = { ...prev, ...a.changes, adjusted: true }
      // A new quantity without a new description: the hours or distance the description names follow it.
      if (a.changes.quantity !== undefined && a.changes.description === undefined) {
        next.description = prev.description.replace(/^(\D*?)(\d+\.\d) (h|km|mi)\b/, (m, lead: string, q: string, unit: string) =>
          (Number(q) === prev.quantity ? `${lead}${a.changes.quantity!.toFixed(1)} ${unit}` : m))
      }
      lines[i] = { ...next, amountCents: roundCents(next.quantity * next.unitCents) }
    }
  }
  return missed
}

const DERIVED = new Set(['minimum', 'supplies'])

/** Prices a call, a draft with the office's changes, or an estimate of a call still in progress. */
export function priceCall(input: PricingInput): PricedInvoice {
  const { rates } = input
  const money = [
    ['labor rate', rates.laborCentsPerHour], ['travel rate', rates.travelCentsPerUnit], ['travel time rate', rates.travelCentsPerHour],
    ['road-call minimum', rates.roadCallMinimumCents], ['environmental fee', rates.environmentalFeeCents]] as const
  for (const [name, v] of money) assertCents(name, v)
  if (rates.shopSuppliesCapCents !== null) assertCents('shop supplies cap', rates.shopSuppliesCapCents)
  const adjustments = input.adjustments ?? []

  const trusted = input.clock.filter(e => !e.flag)
  const excludedClock = input.clock.filter(e => e.flag)
    .map(e => ({ ...(e.id ? { id: e.id } : {}), kind: e.kind, at: new Date(e.at).toISOString(), flag: e.flag! }))
  const spans = clockSpans(trusted, new Date(input.clockUntil))
  const planned = input.planned ?? []
  for (const p of planned) {
    const start = new Date(p.start).getTime()
    if (!Number.isFinite(start) || !Number.isFinite(p.minutes) || p.minutes < 0) {
      throw new RangeError('planned time needs a start and non-negative minutes')
    }
    spans[p.kind].push({ start, end: start + p.minutes * 60_000, ids: [] })
  }
  const isPlanned = (k: 'labor' | 'travel') => planned.some(p => p.kind === k)

  const lines = timeLines('labor', spans.labor, rates.laborCentsPerHour, rates.minimumLaborTenths, rates, isPlanned('labor'))
  const road = adjustments.reduce<number | null | undefined>((d, a) => (a.action === 'road' ? a.distance : d), undefined)
  if (rates.travelBasis === 'time') {
    lines.push(...timeLines('travel', spans.travel, rates.travelCentsPerHour, 0, rates, isPlanned('travel')))
  }
  else lines.push(...distanceLine(input, road))
  lines.push(...partLines(input))
  if (rates.environmentalFeeCents > 0) {
    const description = 'Environmental fee (used fluids, filters and absorbent)'
    const fee = { kind: 'fee' as const, description, quantity: 1, unitCents: rates.environmentalFeeCents, taxable: rates.feesTaxable }
    lines.push(line('env-fee', fee, { rate: 'environmentalFeeCents' }))
  }
  const unapplied = applyAdjustments(lines, adjustments, k => !DERIVED.has(k))

  // Lines worked out from the others, after the office's changes to those.
  const sum = (kinds: InvoiceLineKind[]) => lines.filter(l => kinds.includes(l.kind)).reduce((s, l) => s + l.amountCents, 0)
  const callCharges = sum(['labor', 'travel'])
  if (callCharges < rates.roadCallMinimumCents) {
    const top = rates.roadCallMinimumCents - callCharges
    const description = 'Road-call minimum charge (difference)'
    const fields = { kind: 'minimum' as const, description, quantity: 1, unitCents: top, taxable: rates.laborTaxable }
    lines.push(line('minimum', fields, { rate: 'roadCallMinimumCents' }))
  }
  if (rates.shopSuppliesBasisPoints > 0) {
    const share = roundCents(sum(['labor']) * rates.shopSuppliesBasisPoints / 10_000)
    const amount = rates.shopSuppliesCapCents === null ? share : Math.min(share, rates.shopSuppliesCapCents)
    const cap = rates.shopSuppliesCapCents === null ? '' : `, at most ${formatCents(rates.shopSuppliesCapCents)}`
    if (amount > 0) {
      lines.push(line('supplies', {
        kind: 'fee', description: `Shop supplies (${pctText(rates.shopSuppliesBasisPoints)} % of labor${cap})`,
        quantity: 1, unitCents: amount, taxable: rates.feesTaxable,
      }, { rate: 'shopSuppliesBasisPoints' }))
    }
  }
  const missedDerived = applyAdjustments(lines, adjustments, k => DERIVED.has(k))

  if (input.taxExempt) for (const l of lines) l.taxable = false
  const subtotalCents = lines.reduce((s, l) => s + l.amountCents, 0)
  const taxableCents = lines.filter(l => l.taxable).reduce((s, l) => s + l.amountCents, 0)
  const taxCents = roundCents(taxableCents * rates.taxRateBasisPoints / 10_000)
  const order = new Map(adjustments.map((a, i) => [a, i]))
  const missed = [...unapplied, ...missedDerived].sort((a, b) => order.get(a)! - order.get(b)!)
  return { lines, subtotalCents, taxCents, totalCents: subtotalCents + taxCents, excludedClock, unapplied: missed }
}
