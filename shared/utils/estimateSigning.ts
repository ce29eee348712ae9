// When a card customer's driver must sign the roadside estimate: before the repair, and again when
// the estimate rises above what was signed (more parts, more labor, a request to the fleet). A fleet
// on account is not asked: its approval travels as a PO and an authorization limit instead. The
// phone, the office and the billing desk read these rules from here only.
import type { Estimate } from './estimate'

/** Who pays by card at the roadside (an owner-operator, a cash fleet) signs the estimate; an account customer does not. */
export function signsEstimate(customer: { billingTerms?: unknown } | null | undefined): boolean {
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
