// The whole record of one call, as the office reads it (GET /api/calls/[id]).
import { asc, eq, inArray } from 'drizzle-orm'
import type { StoredSpec } from '#shared/utils/readingFormat'
import type { BillingClockEvent } from '#shared/utils/clockSpans'

/** The spec as people write it ('209.4 Ω ± 2 % (205.2–213.6 Ω)'), by the shared readings formatter. */
function specText(spec: Record<string, unknown> | null, unit: string) {
  try {
    return formatSpec(spec as StoredSpec | null, unit) ?? null
  }
  catch {
    return null
  }
}

/** Travel and labor from the clock (shared/utils/billing.ts), and whether a span is still open. */
function clockTime(events: { kind: BillingClockEvent['kind'], at: Date }[]) {
  const upToNow = clockTotals(events, new Date())
  const latest = new Date(Math.max(0, ...events.map(e => e.at.getTime())))
  const closed = clockTotals(events, latest)
  return {
    travelMinutes: upToNow.travelMs / 60_000, laborMinutes: upToNow.laborMs / 60_000,
    travelRunning: upToNow.travelMs > closed.travelMs, workRunning: upToNow.laborMs > closed.laborMs,
  }
}

type ConflictValue = string | number | boolean | null | unknown[] | Record<string, unknown>

export async function getCallRecord(id: string) {
  const db = useDb()
  const { calls, users, testCards } = tables
  const call = await db.query.calls.findFirst({
    where: eq(calls.id, id),
    with: {
      customer: true,
      unit: true,
      serviceTruck: { columns: { id: true, name: true, plate: true } },
      faultCodes: { orderBy: t => [asc(t.createdAt)] },
      readings: { orderBy: t => [asc(t.createdAt)] },
      testRuns: { orderBy: t => [asc(t.createdAt)] },
      notes: { orderBy: t => [asc(t.createdAt)] },
      photos: { orderBy: t => [asc(t.createdAt)] },
      clockEvents: { orderBy: t => [asc(t.createdAt)] },
      partLines: { orderBy: t => [asc(t.createdAt)] },
      signOffs: true,
      approvalRequests: { orderBy: t => [asc(t.createdAt)] },
      estimateSignatures: { orderBy: t => [asc(t.signedAt)] },
      approvals: { orderBy: t => [asc(t.decidedAt), asc(t.createdAt)] },
      events: { orderBy: t => [asc(t.at), asc(t.createdAt)] },
      conflicts: { orderBy: t => [asc(t.createdAt)] },
    },
  })
  if (!call) return null

  // Names of everyone the record mentions, in one query.
  const personIds = new Set<string>()
  for (const id of [call.mechanicId, call.createdBy]) if (id) personIds.add(id)
  for (const e of call.events) { if (e.byUserId) personIds.add(e.byUserId); if (e.mechanicId) personIds.add(e.mechanicId) }
  for (const c of call.conflicts) { if (c.raisedBy) personIds.add(c.raisedBy); if (c.resolvedBy) personIds.add(c.resolvedBy) }
  for (const a of call.approvals) if (a.recordedBy) personIds.add(a.recordedBy)
  const people = personIds.size
    ? await db.select({
        id: users.id, name: users.name, email: users.email, phone: users.phone, role: users.role,
      }).from(users).where(inArray(users.id, [...personIds]))
    : []
  const person = (pid: string | null) => (pid ? people.find(p => p.id === pid) ?? null : null)
  const cardIds = [...new Set(call.testRuns.map(r => r.cardId))]
  const cards = cardIds.length
    ? await db.select({
        id: testCards.id, title: testCards.title, slug: testCards.slug,
      }).from(testCards).where(inArray(testCards.id, cardIds))
    : []

  const clockAt = (e: { deviceAt: Date | null, createdAt: Date }) => e.deviceAt ?? e.createdAt
  const {
    events, conflicts, signOffs, faultCodes, readings, testRuns, notes, photos, clockEvents, partLines, customer, unit,
    approvalRequests, approvals, estimateSignatures, ...rest
  } = call
  const answered = new Set(approvals.map(a => a.requestId).filter(Boolean))
  return {
    ...withoutXid(rest),
    customer: withoutXid(customer),
    unit: unit ? withoutXid(unit) : null,
    mechanic: person(call.mechanicId),
    createdByPerson: person(call.createdBy),
    faultCodes: faultCodes.map(f => ({ ...withoutXid(f), description: describeFaultCodeSafe(f) })),
    readings: readings.map(r => ({ ...withoutXid(r), specText: specText(r.spec, r.unit) })),
    testRuns: testRuns.map(r => ({ ...withoutXid(r), card: cards.find(c => c.id === r.cardId) ?? null })),
    notes: notes.map(withoutXid),
    photos: photos.map(p => ({ ...withoutXid(p), url: `/api/photos/${p.id}`, pending: !p.uploadedAt })),
    clockEvents: clockEvents.map(e => ({ ...withoutXid(e), at: clockAt(e) })).sort((a, b) => a.at.getTime() - b.at.getTime()),
    time: clockTime(clockEvents.map(e => ({ kind: e.kind, at: clockAt(e) }))),
    partLines: partLines.map(withoutXid),
    story: { complaint: call.storyComplaint, cause: call.storyCause, correction: call.storyCorrection },
    signOff: signOffs[0] ? withoutXid(signOffs[0]) : null,
    // The mechanic's requests for more and the fleet's answers (newest last); waiting while a request has no answer.
    approvalRequests: approvalRequests.map(r => ({ ...withoutXid(r), open: !answered.has(r.id) })),
    approvals: approvals.map(a => ({ ...withoutXid(a), recordedByPerson: person(a.recordedBy) })),
    awaitingApproval: approvalRequests.some(r => !answered.has(r.id)),
    // A card customer's driver signs the estimate before the work (oldest first; the newest is in force).
    estimateSignatures: estimateSignatures.map(withoutXid),
    repairBeforeSignature: repairBeforeSignature({
      card: signsEstimate(customer), signed: estimateSignatures,
      partTimes: partLines.map(p => p.deviceAt ?? p.createdAt), correctionWritten: !!call.storyCorrection?.trim(),
    }),
    conflicts: conflicts.map(c => ({
      ...withoutXid(c), raisedByPerson: person(c.raisedBy), resolvedByPerson: person(c.resolvedBy),
      // jsonb values, typed as JSON so the answer type keeps them.
      baseValue: c.baseValue as ConflictValue, deviceValue: c.deviceValue as ConflictValue,
      serverValue: c.serverValue as ConflictValue, resolvedValue: c.resolvedValue as ConflictValue,
    })),
    events: events.map(e => ({ ...withoutXid(e), by: person(e.byUserId), mechanic: person(e.mechanicId) })),
  }
}

export type CallRecord = NonNullable<Awaited<ReturnType<typeof getCallRecord>>>

/** What a mechanic sees of a call: the customer without billing details (server/utils/mechanicView.ts). */
export function forMechanic(record: CallRecord) {
  return { ...record, customer: mechanicCustomer(record.customer) }
}
