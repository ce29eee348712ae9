// A part's price on the phone is the invoice draft's part line: the phone prices the part lines it keeps
// (fieldPartPrices) and the part form's preview (partPriceOf) with the rates read back from the device;
// the server prices the same rows as the draft does (estimateRecordOfRows → pricingInputOf → priceCall,
// server/utils/pricing.ts). Random parts and markups by fast-check, and two worked by hand.
import fc from 'fast-check'
import { beforeAll, describe, expect, it } from 'vitest'
import { billingRatesOf, priceCall } from '../../shared/utils/billing'
import { estimateRecordOfRows, pricingInputOf } from '../../shared/utils/estimate'
import { applyPull, readRates } from '../../app/utils/syncApply'
import type { EstimateBasis } from '../../app/utils/fieldEstimate'
import { fieldPartPrices, partPriceOf } from '../../app/utils/fieldPartPrice'
import type { CallView } from '../../app/stores/field'
import { freshDevice, pullAnswer } from './outbox-support'

const NOW = new Date('2026-12-01T16:00:00Z')
const RATES = {
  laborCentsPerHour: 14_500, afterHoursMultiplierPct: 150, minimumLaborTenths: 10, roadCallMinimumCents: 17_500,
  travelBasis: 'distance', travelCentsPerUnit: 250, travelUnit: 'mi', travelCentsPerHour: 9_000, roadFactorPct: 120,
  partsMarkupPct: 25, taxRateBasisPoints: 687, laborTaxable: false, travelTaxable: false, partsTaxable: true, coresTaxable: false,
  feesTaxable: true, shopSuppliesBasisPoints: 500, shopSuppliesCapCents: 4_500, environmentalFeeCents: 900, averageRoadKph: 60,
  timeZone: 'America/Chicago', openMinute: 420, closeMinute: 1080, openDays: [1, 2, 3, 4, 5], holidays: [],
}
const uuid = (n: number, tag: string) => `${tag}0000000-0000-4000-8000-${String(n).padStart(12, '0')}`
type Part = { partNumber: string, description: string, quantity: number, unitPriceCents: number, coreChargeCents: number }

let pulled = 0
async function basisWith(markupPct: number): Promise<EstimateBasis> {
  pulled++
  const row = { id: uuid(pulled, 'a'), effectiveFrom: new Date(Date.UTC(2026, 0, 1) + pulled * 1000).toISOString(), ...RATES,
    partsMarkupPct: markupPct }
  await applyPull(pullAnswer({ rates: [JSON.parse(JSON.stringify(row))] }, { cursor: `c${pulled}` }))
  return { rates: await readRates(), trucks: {}, stock: [] }
}
function viewOf(parts: (Part & { id: string })[]) {
  return {
    call: { id: uuid(1, 'd'), status: 'on_site', lat: null, lon: null, serviceTruckId: null },
    customer: { id: uuid(1, 'f'), taxExempt: false }, clockEvents: [], partLines: parts, approvals: [], approvalRequests: [],
  } as unknown as CallView
}
/** The invoice draft's lines for the same rows, as the server prices them. */
function draftLines(parts: (Part & { id: string })[], markupPct: number) {
  return priceCall(pricingInputOf(estimateRecordOfRows({
    rates: billingRatesOf({ ...RATES, partsMarkupPct: markupPct }), site: {}, clock: [], parts, yard: null, taxExempt: false, until: NOW,
  }))).lines
}

beforeAll(async () => {
  await freshDevice()
})

describe('a part\'s price to the customer on the phone', () => {
  it('is cost plus the markup: $24.00 at 25 % is $30.00 each, $90.00 for three', async () => {
    // Markup on cost: price = cost × (1 + markup %) (common practice for parts resale); half-up to the cent.
    const parts = [{ id: uuid(1, 'b'), partNumber: 'TR-DEF-10', description: 'DEF, 10 L jug', quantity: 3, unitPriceCents: 2_400,
      coreChargeCents: 0 }]
    const prices = fieldPartPrices(viewOf(parts), await basisWith(25), NOW)!
    expect(prices.get(parts[0]!.id)!.part.unitCents).toBe(3_000)
    expect(prices.get(parts[0]!.id)!.part.amountCents).toBe(9_000)
    expect(prices.get(parts[0]!.id)!.core).toBeNull()
    // $0.99 at 35 %: 133.65 cents, half-up to $1.34; the core charge is not marked up.
    const small = partPriceOf(billingRatesOf({ ...RATES, partsMarkupPct: 35 }),
      { partNumber: 'F-15', description: 'Fuse 15 A', quantity: 2, unitPriceCents: 99, coreChargeCents: 5_000 })!
    expect(small.part.unitCents).toBe(134)
    expect(small.part.amountCents).toBe(268)
    expect(small.core!.amountCents).toBe(10_000)
  })

  it('equals the invoice draft\'s part and core lines for the same rows: random parts and markups', async () => {
    const partArb = fc.record({
      partNumber: fc.stringMatching(/^[A-Z]{2}-\d{2,4}$/),
      description: fc.constantFrom('Coolant temperature sensor', 'Alternator', 'Air dryer cartridge'),
      quantity: fc.constantFrom(0.5, 1, 2, 3, 12.5),
      unitPriceCents: fc.integer({ min: 0, max: 150_000 }),
      coreChargeCents: fc.integer({ min: 0, max: 20_000 }),
    })
    await fc.assert(fc.asyncProperty(fc.array(partArb, { minLength: 1, maxLength: 4 }), fc.integer({ min: 0, max: 80 }),
      async (partsIn, markup) => {
        const parts = partsIn.map((p, i) => ({ id: uuid(i, 'b'), ...p }))
        const phone = fieldPartPrices(viewOf(parts), await basisWith(markup), NOW)!
        const draft = draftLines(parts, markup)
        for (const p of parts) {
          const line = (kind: string) => draft.find(l => l.key === `${kind}:${p.id}`) ?? null
          expect(phone.get(p.id)!.part).toEqual(line('part'))
          expect(phone.get(p.id)!.core).toEqual(line('core'))
          // The part form's preview, before the part is added, says the same.
          const preview = partPriceOf(billingRatesOf({ ...RATES, partsMarkupPct: markup }), p)!
          expect([preview.part.unitCents, preview.part.amountCents]).toEqual([line('part')!.unitCents, line('part')!.amountCents])
          expect(preview.core?.amountCents ?? null).toEqual(line('core')?.amountCents ?? null)
        }
      }), { numRuns: 40 })
  }, 60_000)
})
