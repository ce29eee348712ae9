// The billing desk: finished calls waiting for an invoice and drafts waiting to be sent, each with
// what a clerk must look at first (shared/utils/billingFlags.ts).
import { and, asc, eq, inArray, sql } from 'drizzle-orm'

type CallRow = typeof tables.calls.$inferSelect

/** Sign-off, open conflicts and untrusted clock times for each call, in three queries. */
async function recordFacts(callIds: string[]) {
  const out = new Map<string, RecordFacts>()
  const none = {
    signedOff: false, openConflicts: 0, untrustedClock: 0, lastApproval: null, awaitingApproval: false, signedEstimates: [], partTimes: [],
  }
  for (const id of callIds) out.set(id, { ...none })
  if (!callIds.length) return out
  const db = useDb()
  const { signOffs, conflicts, clockEvents } = tables
  const [signed, open, clock] = await Promise.all([
    db.select({ callId: signOffs.callId }).from(signOffs).where(inArray(signOffs.callId, callIds)),
    db.select({ callId: conflicts.callId, n: sql<number>`count(*)::int` }).from(conflicts)
      .where(and(inArray(conflicts.callId, callIds), eq(conflicts.status, 'open'))).groupBy(conflicts.callId),
    db.select().from(clockEvents).where(inArray(clockEvents.callId, callIds)),
  ])
  for (const s of signed) out.get(s.callId)!.signedOff = true
  for (const c of open) out.get(c.callId)!.openConflicts = c.n
  // `flag` is set by the server when the phone's clock could not be trusted for that event.
  for (const e of clock) if ((e as { flag?: string | null }).flag) out.get(e.callId)!.untrustedClock++
  // The fleet's answers: the last approval set the limit; a request with no answer still waits.
  const { approvals, approvalRequests } = tables
  const [answers, requests] = await Promise.all([
    db.select().from(approvals).where(inArray(approvals.callId, callIds)).orderBy(asc(approvals.decidedAt)),
    db.select({ id: approvalRequests.id, callId: approvalRequests.callId }).from(approvalRequests)
      .where(inArray(approvalRequests.callId, callIds)),
  ])
  const answered = new Set(answers.map(a => a.requestId))
  for (const a of answers) if (a.decision === 'approved') out.get(a.callId)!.lastApproval = a
  for (const r of requests) if (!answered.has(r.id)) out.get(r.callId)!.awaitingApproval = true
  // What a card customer's driver signed before the work, and when each part went on the record.
  const { estimateSignatures: es, partLines: pl } = tables
  const [signatures, parts] = await Promise.all([
    db.select({ callId: es.callId, driverName: es.driverName, amountCents: es.amountCents, signedAt: es.signedAt }).from(es)
      .where(inArray(es.callId, callIds)),
    db.select({ callId: pl.callId, deviceAt: pl.deviceAt, createdAt: pl.createdAt }).from(pl).where(inArray(pl.callId, callIds)),
  ])
  for (const s of signatures) out.get(s.callId)!.signedEstimates.push(s)
  for (const p of parts) out.get(p.callId)!.partTimes.push(p.deviceAt ?? p.createdAt)
  return out
}

type RecordFacts = {
  signedOff: boolean
  openConflicts: number
  untrustedClock: number
  lastApproval: { approvedBy: string, amountCents: number, poNumber: string | null } | null
  awaitingApproval: boolean
  signedEstimates: { driverName: string, amountCents: number, signedAt: Date }[]
  partTimes: Date[]
}

function flagsOf(call: CallRow, facts: RecordFacts, totalCents: number, onAccount: boolean) {
  const { signedEstimates, partTimes, ...rest } = facts
  const card = !onAccount
  return deskFlags({
    ...rest, totalCents, onAccount, storyCause: call.storyCause, storyCorrection: call.storyCorrection,
    authLimitCents: call.authLimitCents, poNumber: call.poNumber,
    signedEstimate: signatureInForce(signedEstimates),
    repairBeforeSignature: repairBeforeSignature({
      card, signed: signedEstimates, partTimes, correctionWritten: !!call.storyCorrection?.trim(),
    }),
  })
}

/** The flags for one invoice's call, at the invoice's total. */
export async function invoiceFlags(callId: string, totalCents: number) {
  const [call] = await useDb().select().from(tables.calls).where(eq(tables.calls.id, callId))
  const [customer] = call ? await useDb().select().from(tables.customers).where(eq(tables.customers.id, call.customerId)) : []
  if (!call) return []
  return flagsOf(call, (await recordFacts([callId])).get(callId)!, totalCents, customer?.billingTerms === 'account')
}

export type DeskItem = {
  callId: string
  callNumber: number
  invoiceId: string | null
  invoiceNumber: number | null
  customerName: string
  onAccount: boolean
  unitNumber: string | null
  outcome: CallRow['outcome']
  completedAt: Date | null
  totalCents: number
  /** True when the total is what the call would be priced at now, before any invoice exists. */
  estimated: boolean
  flags: ReturnType<typeof deskFlags>
}

/** Finished calls (priced as they would be drafted now) and drafts, flagged ones first, then oldest first. */
export async function listDesk(): Promise<DeskItem[]> {
  const db = useDb()
  const { calls, customers, units, invoices } = tables
  const rows = await db.select({ call: calls, customer: customers, unitNumber: units.unitNumber, invoice: invoices })
    .from(calls).innerJoin(customers, eq(customers.id, calls.customerId)).leftJoin(units, eq(units.id, calls.unitId))
    .leftJoin(invoices, and(eq(invoices.callId, calls.id), eq(invoices.status, 'draft')))
    .where(sql`${calls.status} = 'completed' OR ${invoices.id} IS NOT NULL`).orderBy(asc(calls.completedAt)).limit(200)
  const facts = await recordFacts(rows.map(r => r.call.id))
  const rates = rows.some(r => !r.invoice) ? await ratesInForce() : null
  const items: DeskItem[] = []
  for (const { call, customer, unitNumber, invoice } of rows) {
    let total = invoice?.totalCents ?? 0
    if (!invoice && rates) {
      const input = await pricingInputFor(db, call, rates, customer.taxExempt)
      try {
        total = priceCall(input).totalCents
      }
      catch {
        total = 0
      }
    }
    const onAccount = customer.billingTerms === 'account'
    items.push({
      callId: call.id, callNumber: call.number, invoiceId: invoice?.id ?? null, invoiceNumber: invoice?.number ?? null,
      customerName: customer.name, onAccount, unitNumber, outcome: call.outcome, completedAt: call.completedAt,
      totalCents: total, estimated: !invoice, flags: flagsOf(call, facts.get(call.id)!, total, onAccount),
    })
  }
  return items.sort((a, b) => Number(b.flags.length > 0) - Number(a.flags.length > 0))
}
