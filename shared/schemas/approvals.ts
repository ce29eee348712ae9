// The fleet's approval of a roadside estimate: the mechanic's request for more (a synced record made
// on the phone), the fleet's answer (recorded by the office or through the fleet's link) and the
// mechanic's choice after a decline. One schema per payload; the phone's form, the device's op
// check and the routes use these.
import { z } from 'zod'
import { cleanText, requiredText, text } from './text'

export const APPROVAL_DECISIONS = ['approved', 'declined'] as const
export type ApprovalDecision = (typeof APPROVAL_DECISIONS)[number]
/** How the fleet answered: by phone to the office, by e-mail to the office, or on the fleet's own page (the link). */
export const APPROVAL_CHANNELS = ['phone', 'email', 'link'] as const
export type ApprovalChannel = (typeof APPROVAL_CHANNELS)[number]
/** What the mechanic does after a decline. */
export const DECLINE_CHOICES = ['make_safe_release', 'tow', 'stop'] as const
export type DeclineChoice = (typeof DECLINE_CHOICES)[number]

export const APPROVAL_CHANNEL_LABELS: Record<ApprovalChannel, string> = {
  phone: 'by phone', email: 'by e-mail', link: 'on the fleet\'s approval page',
}
export const DECLINE_CHOICE_LABELS: Record<DeclineChoice, string> = {
  make_safe_release: 'Make safe and release the truck',
  tow: 'Tow it in',
  stop: 'Stop work and leave it as it is',
}

/** The most a single approval may reach: $1,000,000. */
export const APPROVAL_MAX_CENTS = 100_000_000
const cents = (label: string) => z.number({ message: `${label} must be an amount in cents` })
  .int(`${label} must be whole cents`).min(0, `${label} cannot be negative`).max(APPROVAL_MAX_CENTS, `${label} is too large`)

/** A part still needed, as the request lists it (priced at the customer's price by the shared pricing). */
export const plannedPartSchema = z.object({
  partNumber: requiredText(60, 'Part number'),
  description: requiredText(300, 'Description'),
  quantity: z.number({ message: 'Quantity must be a number' }).gt(0, 'Quantity must be more than 0').max(10_000, 'At most 10000'),
  unitPriceCents: cents('Unit price'),
  coreChargeCents: cents('Core charge').default(0),
})
export type PlannedPart = z.output<typeof plannedPartSchema>

/** The `approvalRequest` create op: what the mechanic asks the fleet for. */
export const approvalRequestCreateSchema = z.object({
  callId: z.string().uuid('Not a valid call id'),
  diagnosis: requiredText(300, 'The diagnosis'),
  needed: text(2000, 'What is still needed', { multiline: true }),
  /** Labor still expected, in minutes. */
  plannedLaborMinutes: z.number({ message: 'Labor still needed must be minutes' }).int('Whole minutes')
    .min(0, 'Cannot be negative').max(7 * 24 * 60, 'At most a week'),
  plannedParts: z.array(plannedPartSchema, { message: 'Expected a list of parts' }).max(50, 'At most 50 parts').default([]),
  /** The new total asked for: what the phone's estimate came to with the work still needed. */
  estimateCents: cents('The new total'),
  /** What the call was allowed when the mechanic asked. */
  limitCents: cents('The limit').nullable().default(null),
  photoIds: z.array(z.string().uuid('Not a valid photo id'), { message: 'Expected a list of photo ids' }).max(20, 'At most 20 photos')
    .default([]),
})
export type ApprovalRequestCreate = z.output<typeof approvalRequestCreateSchema>

const decisionFields = {
  decision: z.enum(APPROVAL_DECISIONS, { message: 'Choose approved or declined' }),
  approvedBy: requiredText(120, 'The name of who answered at the fleet', { missing: 'Enter the name of who answered at the fleet' }),
  poNumber: text(60, 'PO number'),
}

/** POST /api/calls/[id]/approvals: the office records the fleet's answer. */
export const approvalDecisionSchema = z.object({
  ...decisionFields,
  amountCents: cents('The amount'),
  channel: z.enum(APPROVAL_CHANNELS, { message: 'Choose phone, email or link' }),
  /** The request this answers (the office's page sends it); without it, the newest open request, if any. */
  requestId: z.string().uuid('Not a valid request id').optional(),
}).superRefine((v, ctx) => {
  if (v.decision === 'approved' && v.amountCents === 0) {
    ctx.addIssue({ code: 'custom', path: ['amountCents'], message: 'An approval needs the amount approved' })
  }
})
export type ApprovalDecisionInput = z.input<typeof approvalDecisionSchema>

/** POST /api/approve/[token]: the fleet's contact answers on their own page; the amount is the request's unless typed. */
export const linkDecisionSchema = z.object({
  ...decisionFields,
  amountCents: cents('The amount').optional(),
})
export type LinkDecisionInput = z.input<typeof linkDecisionSchema>

/** POST /api/calls/[id]/approval-link: a new approval link; with `sendTo` it is also e-mailed there. */
export const approvalLinkSchema = z.object({
  sendTo: cleanText('The address').toLowerCase().max(200, 'The address is too long')
    .pipe(z.email('Enter an e-mail address like ops@fleet.example')).optional(),
})
