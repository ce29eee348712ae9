// The fleet's answer to a roadside estimate. One rule for every way it arrives (the office records a
// phone call or an e-mail, or the fleet answers on its own page): lock the call, check it can still
// take an answer, write who, how much, which PO, how and when, and on an approval raise the call's
// limit and set its PO, all in one transaction. The answer closes the request it answers and every
// approval link of that request, so a link is used once.
import { and, asc, desc, eq, isNull, sql } from 'drizzle-orm'
import type { User } from '#auth-utils'
import { APPROVAL_CHANNEL_LABELS, type ApprovalChannel, type ApprovalDecision } from '#shared/schemas/approvals'
import type { PricedLine } from '#shared/utils/billing'
import type { CoverStep } from '#shared/utils/estimate'

type CallRow = typeof tables.calls.$inferSelect
export type ApprovalRow = typeof tables.approvals.$inferSelect
export type ApprovalRequestRow = typeof tables.approvalRequests.$inferSelect

export type ApprovalInput = {
  decision: ApprovalDecision
  approvedBy: string
  amountCents: number
  poNumber?: string | null
  channel: ApprovalChannel
  requestId?: string
}
/** Who wrote it: an office user, or the fleet's link (no account). */
export type ApprovalAuthor = { user: User } | { linkId: string, requestId: string }

/** SQL: the call has a request from the mechanic that no answer has closed yet. */
export const awaitingApprovalSql = (callId: unknown) => sql<boolean>`EXISTS (
  SELECT 1 FROM approval_requests r WHERE r.call_id = ${callId}
    AND NOT EXISTS (SELECT 1 FROM approvals a WHERE a.request_id = r.id))`

/** The call's newest request that no answer has closed, or undefined. */
export async function openRequestOf(tx: Db | Tx, callId: string): Promise<ApprovalRequestRow | undefined> {
  const { approvalRequests: r, approvals: a } = tables
  const [row] = await tx.select({ r }).from(r).leftJoin(a, eq(a.requestId, r.id))
    .where(and(eq(r.callId, callId), isNull(a.id))).orderBy(desc(r.createdAt)).limit(1)
  return row?.r
}

/** The call row locked for this transaction: two answers at once take turns, and the second sees the first. */
async function lockCall(tx: Tx, callId: string): Promise<CallRow | undefined> {
  const [call] = await tx.select().from(tables.calls).where(eq(tables.calls.id, callId)).for('update')
  return call
}

/** A call that can still take the fleet's answer: not cancelled, not billed. */
function checkAnswerable(call: CallRow) {
  if (isLockedStatus(call.status)) {
    ruleError('status', `The call is ${STATUS_LABELS[call.status].toLowerCase()}; it takes no approval any more`)
  }
}

function alreadyAnswered(field: string, message: string): never {
  const data = { fields: { [field]: message } }
  throw createError({ status: 409, statusText: 'Already answered', message: `${field}: ${message}`, data })
}

/** The same answer again within minutes (a second click, two people typing the same phone call) is refused, not recorded twice. */
async function refuseRepeat(tx: Tx, callId: string, input: ApprovalInput) {
  const a = tables.approvals
  const [last] = await tx.select().from(a).where(eq(a.callId, callId)).orderBy(desc(a.decidedAt)).limit(1)
  const same = last && last.decision === input.decision && last.amountCents === input.amountCents
    && (last.poNumber ?? null) === (input.poNumber || null) && last.approvedBy === input.approvedBy
  if (same && Date.now() - last.decidedAt.getTime() < REPEAT_WINDOW_MS) alreadyAnswered('decision', 'This answer is already recorded')
}
const REPEAT_WINDOW_MS = 10 * 60_000

/**
 * Records the fleet's answer. An approval raises the call's limit to the amount and sets its PO (kept
 * when none is given); a decline leaves both. A timeline row says who and how.
 */
export async function recordApproval(callId: string, input: ApprovalInput, author: ApprovalAuthor) {
  return useDb().transaction(async (tx) => {
    const call = await lockCall(tx, callId)
    if (!call) throw createError({ status: 404, statusText: 'Call not found' })
    checkAnswerable(call)
    let request: ApprovalRequestRow | undefined
    if ('linkId' in author) {
      // The link answers its own request, once: anything that answered it first closed the link.
      request = await openRequestOf(tx, callId)
      if (!request || request.id !== author.requestId) linkNotFound()
    }
    else {
      request = await openRequestOf(tx, callId)
      if (input.requestId && request?.id !== input.requestId) alreadyAnswered('requestId', 'This request already has the fleet\'s answer')
      await refuseRepeat(tx, callId, input)
    }
    const approved = input.decision === 'approved'
    const poNumber = input.poNumber || null
    const [row] = await tx.insert(tables.approvals).values({
      callId, requestId: request?.id ?? null, decision: input.decision, approvedBy: input.approvedBy, amountCents: input.amountCents,
      poNumber, channel: input.channel, decidedAt: new Date(), recordedBy: 'user' in author ? author.user.id : null,
      linkId: 'linkId' in author ? author.linkId : null, previousLimitCents: call.authLimitCents, previousPoNumber: call.poNumber,
    }).returning()
    const changes = approved ? { authLimitCents: input.amountCents, poNumber: poNumber ?? call.poNumber } : {}
    // Every answer touches the call, so the phone's next pull brings the call with it.
    const [after] = await tx.update(tables.calls).set({ ...changes, updatedAt: new Date() }).where(eq(tables.calls.id, callId)).returning()
    const how = APPROVAL_CHANNEL_LABELS[input.channel]
    const note = approved
      ? `Approved up to ${formatCents(input.amountCents)}${poNumber ? `, PO ${poNumber}` : ''}, by ${input.approvedBy} ${how}`
      : `Declined by ${input.approvedBy} ${how}`
    await tx.insert(tables.callEvents).values({
      callId, kind: approved ? 'approval_approved' : 'approval_declined', byUserId: 'user' in author ? author.user.id : null, note,
    })
    if (request) await revokeLinks('estimate_approval', request.id, tx)
    return { approval: withoutXid(row!), call: { id: after!.id, authLimitCents: after!.authLimitCents, poNumber: after!.poNumber } }
  })
}

/**
 * The invoice's lines beside the approvals that covered them: the limit the call was taken with,
 * then each approval in turn; lines past the last approved amount are covered by none.
 */
type InvoiceLinesOf = {
  callId: string
  ratesId: string | null
  totalCents: number
  lines: { key: string | null, description: string, amountCents: number, taxable: boolean }[]
}
export async function invoiceApprovals(invoice: InvoiceLinesOf) {
  const db = useDb()
  const [call] = await db.select().from(tables.calls).where(eq(tables.calls.id, invoice.callId))
  const answers = await db.select().from(tables.approvals).where(eq(tables.approvals.callId, invoice.callId))
    .orderBy(asc(tables.approvals.decidedAt))
  const [rates] = invoice.ratesId ? await db.select().from(tables.rates).where(eq(tables.rates.id, invoice.ratesId)) : []
  const first = answers[0]
  const initial = first ? first.previousLimitCents : call?.authLimitCents ?? null
  const steps: CoverStep[] = []
  if (initial != null) steps.push({ id: null, amountCents: initial, label: 'Limit given with the call' })
  for (const a of answers) {
    if (a.decision !== 'approved') continue
    const po = a.poNumber ? `, PO ${a.poNumber}` : ''
    const how = APPROVAL_CHANNEL_LABELS[a.channel as ApprovalChannel]
    steps.push({ id: a.id, amountCents: a.amountCents, label: `Approved by ${a.approvedBy} ${how}${po}` })
  }
  if (!steps.length && !answers.length) return null
  const lines = invoice.lines.map((l, i) => ({ ...l, key: l.key ?? `line:${i}` })) as PricedLine[]
  const priced = { lines, totalCents: invoice.totalCents }
  const cover = approvalCoverage(priced, rates?.taxRateBasisPoints ?? 0, steps)
  return {
    answers: answers.map(a => ({ id: a.id, decision: a.decision, approvedBy: a.approvedBy, amountCents: a.amountCents, poNumber: a.poNumber,
      channel: a.channel, decidedAt: a.decidedAt })),
    lines: cover.lines.map(l => ({ key: l.key, description: l.description, amountCents: l.amountCents, runningCents: l.runningCents,
      coveredBy: l.coveredBy })),
    approvedCents: cover.approvedCents,
    pastCents: cover.pastCents,
  }
}
