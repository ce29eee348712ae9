// A part line's price to the customer on the phone: the invoice draft's own part and core lines,
// priced by the one pricing function (priceCall, through pricingInputOf) from the record the phone
// keeps, so the mechanic sees what the invoice will charge (cost plus the shop's markup), not the cost.
import { priceCall, type BillingPart, type BillingRates, type PricedLine } from '#shared/utils/billing'
import { pricingInputOf } from '#shared/utils/estimate'
import type { CallView } from '~/stores/field'
import { fieldEstimateRecord, type EstimateBasis } from './fieldEstimate'

/** What the invoice charges for one part line: the part line (marked up) and its core line, before tax. */
export type PartPrice = { part: PricedLine, core: PricedLine | null }

function byPart(lines: readonly PricedLine[], ref: (l: PricedLine) => string | undefined) {
  const out = new Map<string, PartPrice>()
  for (const l of lines) {
    const id = ref(l)
    if (!id || (l.kind !== 'part' && l.kind !== 'core')) continue
    const p = out.get(id)
    if (l.kind === 'part') out.set(id, { part: l, core: p?.core ?? null })
    else if (p) p.core = l
  }
  return out
}

/** Each part line of the call (by id) as the invoice draft prices it; null with no rates on the phone or a line pricing refuses. */
export function fieldPartPrices(view: CallView, basis: EstimateBasis, now: Date): Map<string, PartPrice> | null {
  const record = fieldEstimateRecord(view, basis, now)
  if (!record) return null
  try {
    return byPart(priceCall(pricingInputOf(record)).lines, l => l.source.partLineId)
  }
  catch {
    return null
  }
}

/** One part as the invoice would price it (the part form's preview before it is added); null when pricing refuses it. */
export function partPriceOf(rates: BillingRates, part: Omit<BillingPart, 'id'>): PartPrice | null {
  try {
    const priced = priceCall({
      rates, clock: [], clockUntil: new Date(0).toISOString(), distance: { straightKm: null, roadKm: null },
      parts: [{ ...part, id: 'preview' }], taxExempt: false,
    })
    return byPart(priced.lines, l => l.source.partLineId).get('preview') ?? null
  }
  catch {
    return null
  }
}
