// What a billing clerk must see before an invoice goes out, most serious first. One list, read
// by the billing desk, the invoice page and the tests.
import { formatCents } from './money'

export type DeskFlagCode = 'untrusted_clock' | 'open_conflicts' | 'over_limit' | 'past_approval' | 'past_signed_estimate'
  | 'unsigned_estimate' | 'awaiting_approval' | 'no_sign_off' | 'no_story' | 'no_po'
export type DeskFlag = { code: DeskFlagCode, text: string }

export type DeskFacts = {
  storyCause: string | null
  storyCorrection: string | null
  signedOff: boolean
  openConflicts: number
  /** Clock events the server flagged (the phone's clock could not be trusted); left out of the price. */
  untrustedClock: number
  totalCents: number
  authLimitCents: number | null
  poNumber: string | null
  /** Fleets on account match invoices to purchase orders; a card customer needs none. */
  onAccount: boolean
  /** The fleet's last approval, when there is one (it set the limit). */
  lastApproval?: { approvedBy: string, amountCents: number, poNumber: string | null } | null
  /** The mechanic asked the fleet for more and no answer is recorded. */
  awaitingApproval?: boolean
  /** The estimate a card customer's driver signed before the work (the one in force), when there is one. */
  signedEstimate?: { driverName: string, amountCents: number } | null
  /** A card customer's repair went on the record before the driver signed the estimate (shared/utils/estimateSigning.ts). */
  repairBeforeSignature?: boolean
}

const blank = (s: string | null) => !s || !s.trim()

export function deskFlags(f: DeskFacts): DeskFlag[] {
  const out: DeskFlag[] = []
  if (f.untrustedClock > 0) {
    const n = f.untrustedClock
    out.push({ code: 'untrusted_clock', text: `${n} clock time${n === 1 ? '' : 's'} the phone could not be trusted on: not billed` })
  }
  if (f.openConflicts > 0) {
    out.push({ code: 'open_conflicts', text: `${f.openConflicts} open conflict${f.openConflicts === 1 ? '' : 's'} to settle` })
  }
  if (f.authLimitCents !== null && f.totalCents > f.authLimitCents && f.lastApproval) {
    const a = f.lastApproval
    const past = formatCents(f.totalCents - f.authLimitCents)
    const po = a.poNumber ? ` (PO ${a.poNumber})` : ''
    const text = `Work past the fleet's approval: ${past} over the ${formatCents(f.authLimitCents)} ${a.approvedBy} approved${po}`
    out.push({ code: 'past_approval', text: `${text}; ask the fleet or take it off before sending` })
  }
  else if (f.authLimitCents !== null && f.totalCents > f.authLimitCents) {
    out.push({ code: 'over_limit', text: `Total ${formatCents(f.totalCents)} is over the authorized ${formatCents(f.authLimitCents)}` })
  }
  // A card customer signs for an amount as a fleet approves one: billing above it is the same overrun.
  if (!f.onAccount && f.signedEstimate && f.totalCents > f.signedEstimate.amountCents) {
    const s = f.signedEstimate
    const past = formatCents(f.totalCents - s.amountCents)
    const text = `Billed above the estimate the driver signed: ${past} over the ${formatCents(s.amountCents)} ${s.driverName} signed`
    out.push({ code: 'past_signed_estimate', text: `${text}; ask the driver or take it off before sending` })
  }
  if (!f.onAccount && f.repairBeforeSignature) {
    out.push({ code: 'unsigned_estimate', text: 'Repair recorded before the driver signed the estimate' })
  }
  if (f.awaitingApproval) out.push({ code: 'awaiting_approval', text: 'The mechanic asked the fleet for more; no answer is recorded' })
  if (!f.signedOff) out.push({ code: 'no_sign_off', text: 'No driver sign-off' })
  if (blank(f.storyCause) || blank(f.storyCorrection)) {
    out.push({ code: 'no_story', text: 'Story incomplete (cause or correction missing)' })
  }
  if (f.onAccount && blank(f.poNumber)) out.push({ code: 'no_po', text: 'No PO number for an account customer' })
  return out
}
