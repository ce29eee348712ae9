// When a card customer's driver must sign the roadside estimate: before the repair, and again when
// the estimate rises above what was signed (more parts, more labor, a request to the fleet). A fleet
// on account is not asked: its approval travels as a PO and an authorization limit instead. The
// phone, the office and the billing desk read these rules from here only.
import type { PricedLine } from './billing'
import { clockSpans } from './clockSpans'
import type { Estimate, EstimatePlan, EstimateRecord } from './estimate'
import type { PlannedPart } from '../schemas/approvals'

/**
 * Who pays by card at the roadside (an owner-operator, a cash fleet) signs the estimate; an account
 * customer does not. The mechanic's copy of a customer carries this answer, not the billing terms.
 */
export function signsEstimate(customer: { billingTerms?: unknown, signsEstimate?: unknown } | null | undefined): boolean {
  if (typeof customer?.signsEstimate === 'boolean') return customer.signsEstimate
  return customer?.billingTerms === 'card'
}

/** A signed estimate as either side keeps it. */
export type SignedEstimate = { amountCents: number, signedAt?: string | Date | null, deviceAt?: string | Date | null }

/** The signature in force: the newest one signed. */
export function signatureInForce<S extends SignedEstimate>(signed: readonly S[]): S | null {
  const at = (s: SignedEstimate) => new Date(s.signedAt ?? s.deviceAt ?? 0).getTime()
  return signed.reduce<S | null>((best, s) => (!best || at(s) >= at(best) ? s : best), null)
}

/**
 * What the estimate comes to now, for the signature: the larger of what is on record so far (the
 * clock runs, parts are added) and the total with the work asked of the fleet.
 */
export function estimateToSign(e: Pick<Estimate, 'sofar' | 'expected'>): number {
  return Math.max(e.sofar.totalCents, e.expected.totalCents)
}

/**
 * The work of a signed estimate still to come: its labor less the labor on the clock since it was
 * signed, its parts less the ones put on the call's parts list since (matched by part number). The
 * record priced with it is what the signed estimate comes to now, so a part it did not have, or
 * labor past it, takes the total above what was signed.
 */
export function signedPlanLeft(
  signed: { plannedLaborMinutes?: unknown, plannedParts?: unknown, signedAt?: string | Date | null, deviceAt?: string | Date | null },
  record: Pick<EstimateRecord, 'clock' | 'parts' | 'until'>,
): EstimatePlan {
  const from = new Date(signed.signedAt ?? signed.deviceAt ?? 0).getTime()
  const until = new Date(record.until)
  const trusted = record.clock.filter(c => !c.flag)
  const workedMs = clockSpans(trusted, until).labor.reduce((n, x) => n + Math.max(0, x.end - Math.max(x.start, from)), 0)
  const laborMinutes = Math.max(0, Math.round(Number(signed.plannedLaborMinutes ?? 0) - workedMs / 60_000))
  const onList = new Map<string, number>()
  for (const p of record.parts) onList.set(p.partNumber, (onList.get(p.partNumber) ?? 0) + p.quantity)
  const parts: EstimatePlan['parts'] = []
  for (const p of (Array.isArray(signed.plannedParts) ? signed.plannedParts : []) as PlannedPart[]) {
    const have = onList.get(p.partNumber) ?? 0
    const used = Math.min(have, p.quantity)
    onList.set(p.partNumber, have - used)
    if (p.quantity > used) parts.push({ ...p, quantity: p.quantity - used, coreChargeCents: p.coreChargeCents ?? 0 })
  }
  return { laborMinutes, parts }
}

export type SigningState
  /** An account customer: nothing to sign before the work. */
  = | { need: 'not_asked' }
  /** A card customer with no signed estimate yet. */
    | { need: 'unsigned' }
  /** Signed, and the estimate now is above what was signed: a new signature is asked. */
    | { need: 'above', signedCents: number, overCents: number }
  /** Signed, and the estimate stays within it. */
    | { need: 'signed', signedCents: number }

/** Where a call stands: asked or not, signed or not, and whether the estimate went above the signature. */
export function signingState(card: boolean, signed: readonly SignedEstimate[], estimateCents: number | null): SigningState {
  if (!card) return { need: 'not_asked' }
  const last = signatureInForce(signed)
  if (!last) return { need: 'unsigned' }
  if (estimateCents != null && estimateCents > last.amountCents) {
    return { need: 'above', signedCents: last.amountCents, overCents: estimateCents - last.amountCents }
  }
  return { need: 'signed', signedCents: last.amountCents }
}

/** Whether the phone asks for a signature now (none yet, or the estimate went above it). */
export const signatureAsked = (s: SigningState) => s.need === 'unsigned' || s.need === 'above'

/**
 * Whether repair work went on the record before the driver signed: a part added before the first
 * signature, or a part or the correction written with no signature at all.
 */
export function repairBeforeSignature(r: {
  card: boolean
  signed: readonly SignedEstimate[]
  partTimes: readonly (string | Date)[]
  correctionWritten: boolean
}): boolean {
  if (!r.card) return false
  const times = r.signed.map(s => new Date(s.signedAt ?? s.deviceAt ?? 0).getTime())
  if (!times.length) return r.partTimes.length > 0 || r.correctionWritten
  const first = Math.min(...times)
  return r.partTimes.some(t => new Date(t).getTime() < first)
}

/** A priced line of work still to be done: planned labor, or a part not yet on the call's parts list. */
export function isPlannedLine(l: Pick<PricedLine, 'kind' | 'source'>): boolean {
  return !!l.source.planned || ((l.kind === 'part' || l.kind === 'core') && !l.source.partLineId)
}
