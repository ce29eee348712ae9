// When a card customer's driver signs the estimate, and when a new signature is asked, checked
// against the invoice draft's own total on the same record (priceCall over pricingInputOf, as the
// server drafts it). Amounts are worked by hand from the rates below.
import { describe, expect, it } from 'vitest'
import { priceCall, type BillingRates } from '../../shared/utils/billing'
import { estimateCall, pricingInputOf, type EstimateRecord } from '../../shared/utils/estimate'
import {
  estimateToSign, repairBeforeSignature, signatureAsked, signatureInForce, signedPlanLeft, signingState, signsEstimate,
} from '../../shared/utils/estimateSigning'
import { estimateSignatureCreateSchema } from '../../shared/schemas/estimateSignature'

// $145.00 an hour, no minimums, no travel priced, parts at cost, 8.25 % tax on parts only, one rate all day.
const RATES: BillingRates = {
  laborCentsPerHour: 14_500, afterHoursMultiplierPct: 100, minimumLaborTenths: 0, roadCallMinimumCents: 0,
  travelBasis: 'distance', travelCentsPerUnit: 0, travelUnit: 'km', travelCentsPerHour: 0, roadFactorPct: 100,
  partsMarkupPct: 0, taxRateBasisPoints: 825, laborTaxable: false, travelTaxable: false, partsTaxable: true, coresTaxable: false,
  feesTaxable: false, shopSuppliesBasisPoints: 0, shopSuppliesCapCents: null, environmentalFeeCents: 0,
  timeZone: 'UTC', openMinute: 0, closeMinute: 1440, openDays: [0, 1, 2, 3, 4, 5, 6], holidays: [],
}
const T0 = Date.parse('2026-11-30T14:00:00Z')
const at = (min: number) => new Date(T0 + min * 60_000).toISOString()
const SENSOR = {
  partNumber: 'TR-ECT-10K', description: 'Coolant temperature sensor', quantity: 1, unitPriceCents: 12_000, coreChargeCents: 0,
}
const PIGTAIL = { partNumber: 'TR-PT-3', description: 'Sensor pigtail', quantity: 1, unitPriceCents: 8_000, coreChargeCents: 0 }

function record(untilMin: number, parts: EstimateRecord['parts'] = [], stopMin?: number): EstimateRecord {
  const clock: EstimateRecord['clock'] = [{ kind: 'work_start', at: at(0) }]
  if (stopMin != null) clock.push({ kind: 'work_stop', at: at(stopMin) })
  return { rates: RATES, clock, parts, yard: null, site: { lat: null, lon: null }, taxExempt: false, until: at(untilMin) }
}
/** The invoice draft's total on a record, priced as the server drafts it. */
const draftTotal = (r: EstimateRecord) => priceCall(pricingInputOf(r)).totalCents

describe('who signs the estimate', () => {
  it('a card customer does; a fleet on account does not, nor a call whose customer the phone does not know', () => {
    expect(signsEstimate({ billingTerms: 'card' })).toBe(true)
    expect(signsEstimate({ billingTerms: 'account' })).toBe(false)
    expect(signsEstimate(null)).toBe(false)
    // The mechanic's copy of a customer says it in a word of its own, without the billing terms.
    expect(signsEstimate({ signsEstimate: true })).toBe(true)
    expect(signsEstimate({ signsEstimate: false })).toBe(false)
    expect(signingState(false, [], 50_000)).toEqual({ need: 'not_asked' })
    expect(signatureAsked(signingState(false, [], 50_000))).toBe(false)
  })
})

describe('the signature against the invoice draft on the same record', () => {
  // At the truck, half an hour in: the sensor and an hour and a half of labor still to do.
  const atSigning = record(30)
  const estimate = estimateCall(atSigning, null, { laborMinutes: 90, parts: [SENSOR] })
  const signedCents = estimateToSign(estimate)

  it('the driver is asked before anything is signed', () => {
    expect(signingState(true, [], signedCents)).toEqual({ need: 'unsigned' })
    expect(signatureAsked(signingState(true, [], signedCents))).toBe(true)
  })

  it('signs the estimate of the work planned: 2.0 h and the sensor with its tax', () => {
    // worked by hand: (0.5 h + 1.5 h) × $145.00 = $290.00; sensor $120.00; tax 8.25 % of $120.00 = $9.90 → $419.90
    expect(signedCents).toBe(41_990)
    expect(estimate.expected.taxCents).toBe(990)
    expect(estimate.expected.lines.reduce((s, l) => s + l.amountCents, 0) + estimate.expected.taxCents).toBe(signedCents)
  })

  it('asks nothing more when the work comes in as estimated: the invoice draft equals what was signed', () => {
    const done = record(120, [SENSOR], 120)
    expect(draftTotal(done)).toBe(41_990)
    const now = estimateToSign(estimateCall(done, null))
    expect(signingState(true, [{ amountCents: signedCents, signedAt: at(30) }], now)).toEqual({ need: 'signed', signedCents: 41_990 })
  })

  it('asks for a new signature once more parts take the draft above what was signed', () => {
    const more = record(120, [SENSOR, PIGTAIL], 120)
    // worked by hand: $419.90 + pigtail $80.00 + 8.25 % of $80.00 ($6.60) = $506.50
    expect(draftTotal(more)).toBe(50_650)
    const state = signingState(true, [{ amountCents: signedCents, signedAt: at(30) }], estimateToSign(estimateCall(more, null)))
    expect(state).toEqual({ need: 'above', signedCents: 41_990, overCents: 8_660 })
    expect(signatureAsked(state)).toBe(true)
    // The driver signs again for the new amount: the newest signature is the one in force.
    const again = [{ amountCents: signedCents, signedAt: at(30) }, { amountCents: 50_650, signedAt: at(125) }]
    expect(signingState(true, again, draftTotal(more))).toEqual({ need: 'signed', signedCents: 50_650 })
  })

  it('halfway through the signed work, the signed estimate still comes to what was signed; a part it did not have goes above', () => {
    const signature = { amountCents: signedCents, signedAt: at(30), plannedLaborMinutes: 90, plannedParts: [SENSOR] }
    const midway = record(60)
    const left = signedPlanLeft(signature, midway)
    // 30 of the 90 minutes worked since signing; the sensor not yet on the parts list.
    expect(left).toEqual({ laborMinutes: 60, parts: [SENSOR] })
    expect(estimateToSign(estimateCall(midway, null, left))).toBe(41_990)
    const withPigtail = record(60, [{ id: 'p1', ...PIGTAIL }])
    const now = estimateToSign(estimateCall(withPigtail, null, signedPlanLeft(signature, withPigtail)))
    // worked by hand: $419.90 + $80.00 + $6.60 = $506.50, the sensor and the labor still to come
    expect(now).toBe(50_650)
    expect(signingState(true, [signature], now)).toEqual({ need: 'above', signedCents: 41_990, overCents: 8_660 })
    // The sensor fitted: off the plan, and the estimate stays at what was signed.
    const fitted = record(60, [{ id: 'p2', ...SENSOR }])
    expect(signedPlanLeft(signature, fitted).parts).toEqual([])
    expect(estimateToSign(estimateCall(fitted, null, signedPlanLeft(signature, fitted)))).toBe(41_990)
  })

  it('asks again when a request to the fleet takes the estimate above the signature, though nothing more is on record', () => {
    const asking = estimateCall(record(60), null, { laborMinutes: 180, parts: [SENSOR] })
    // worked by hand: (1.0 h + 3.0 h) × $145.00 = $580.00 + $120.00 + $9.90 = $709.90
    expect(estimateToSign(asking)).toBe(70_990)
    expect(asking.sofar.totalCents).toBeLessThan(signedCents)
    expect(signingState(true, [{ amountCents: signedCents, signedAt: at(30) }], estimateToSign(asking)).need).toBe('above')
  })

  it('asks again when the clock runs past the labor signed for', () => {
    const long = record(200, [SENSOR], 200)
    // 3 h 20 min on the clock against the 2.0 h signed for, the same sensor: more than was signed whatever the rounding.
    expect(draftTotal(long)).toBeGreaterThan(signedCents)
    expect(signingState(true, [{ amountCents: signedCents, signedAt: at(30) }], estimateToSign(estimateCall(long, null))).need)
      .toBe('above')
  })
})

describe('the signature in force and repair before it', () => {
  it('is the newest signed, whatever order they arrive in', () => {
    const s = [{ amountCents: 2, signedAt: at(90) }, { amountCents: 1, signedAt: at(10) }, { amountCents: 3, deviceAt: at(60) }]
    expect(signatureInForce(s)?.amountCents).toBe(2)
    expect(signatureInForce([])).toBeNull()
  })

  it('a part before the first signature, or repair with no signature at all, is repair before it; an account is never', () => {
    const signed = [{ amountCents: 41_990, signedAt: at(30) }]
    expect(repairBeforeSignature({ card: true, signed, partTimes: [at(45)], correctionWritten: true })).toBe(false)
    expect(repairBeforeSignature({ card: true, signed, partTimes: [at(20), at(45)], correctionWritten: false })).toBe(true)
    expect(repairBeforeSignature({ card: true, signed: [], partTimes: [], correctionWritten: true })).toBe(true)
    expect(repairBeforeSignature({ card: true, signed: [], partTimes: [], correctionWritten: false })).toBe(false)
    expect(repairBeforeSignature({ card: false, signed: [], partTimes: [at(20)], correctionWritten: true })).toBe(false)
  })
})

describe('the signed estimate as the wire takes it', () => {
  const good = {
    callId: '00000000-0000-4000-8000-000000000001', driverName: 'Dale Okafor', signature: 'data:image/png;base64,AAAA',
    work: 'Replace the coolant temperature sensor', plannedLaborMinutes: 90, plannedParts: [SENSOR],
    lines: [{ description: 'Labor', amountCents: 29_000 }, { description: 'Coolant temperature sensor', amountCents: 12_000 }],
    taxCents: 990, amountCents: 41_990,
  }
  it('takes whole cents that add up, and names the field it refuses', () => {
    expect(estimateSignatureCreateSchema.safeParse(good).success).toBe(true)
    const bad = (v: Record<string, unknown>) => {
      const r = estimateSignatureCreateSchema.safeParse({ ...good, ...v })
      return r.success ? [] : r.error.issues.map(i => i.path.join('.'))
    }
    expect(bad({ amountCents: 41_990.5 })).toContain('amountCents')
    expect(bad({ amountCents: -1 })).toContain('amountCents')
    expect(bad({ amountCents: 41_000 })).toEqual(['amountCents'])
    expect(bad({ driverName: '' })).toContain('driverName')
    expect(bad({ signature: 'not an image' })).toContain('signature')
    expect(bad({ lines: [] })).toContain('lines')
  })
})
