// The mechanic's e-mails about a call: its assignment and its cancellation. Both are written inside
// the transaction that assigns or cancels (through the caller's `tx`), so the call and its notice
// commit together: a crash between the two can no longer leave an assignment without its e-mail.
import { eq } from 'drizzle-orm'
import type { User } from '#auth-utils'
import { LAMP_LABELS } from '#shared/schemas/calls'

export type NoticeResult = { queued: boolean, reason?: string }

/** The call as this transaction sees it, with what a notice names. */
async function callForNotice(tx: Tx, callId: string) {
  return tx.query.calls.findFirst({
    where: eq(tables.calls.id, callId),
    with: {
      customer: { columns: { name: true, phone: true } },
      unit: { columns: { unitNumber: true, yearMakeModel: true, vin: true } },
      mechanic: { columns: { email: true } },
      serviceTruck: { columns: { name: true } },
    },
  })
}

/** The mechanic's notice of a new call: who, what, where, and the scene cautions. */
export async function queueAssignmentMail(tx: Tx, callId: string, user: User | null): Promise<NoticeResult> {
  const rec = await callForNotice(tx, callId)
  if (!rec?.mechanic) return { queued: false, reason: 'no mechanic' }
  const u = rec.unit
  const lamps = rec.lamps.map(l => (LAMP_LABELS as Record<string, string>)[l] ?? l).join(', ')
  const load = [rec.loaded ? 'loaded' : null, rec.hazmat ? 'HAZMAT on board' : null].filter(Boolean).join(', ')
  const lines = [
    `Call #${rec.number} is yours.`,
    '',
    `Customer: ${rec.customer.name}${rec.customer.phone ? ` (${rec.customer.phone})` : ''}`,
    `Unit: ${u ? [u.unitNumber, u.yearMakeModel, u.vin ? `VIN ${u.vin}` : null].filter(Boolean).join(' · ') : 'not given'}`,
    `Location: ${rec.locationText}${rec.lat !== null && rec.lon !== null ? ` (${rec.lat.toFixed(5)}, ${rec.lon.toFixed(5)})` : ''}`,
    `Complaint: ${rec.complaint}`,
    lamps ? `Lamps on: ${lamps}` : null,
    rec.derate !== 'none' ? `Engine: ${derateText(rec.derate, rec.derateNote)}` : null,
    load ? `Load: ${load}` : null,
    rec.safetyNotes ? `Scene: ${rec.safetyNotes}` : null,
    rec.callerName || rec.callerPhone ? `Caller: ${[rec.callerName, rec.callerPhone].filter(Boolean).join(', ')}` : null,
    rec.poNumber ? `PO: ${rec.poNumber}` : null,
    rec.authLimitCents !== null ? `Authorized up to: ${formatCents(rec.authLimitCents)}` : null,
    rec.serviceTruck ? `Service truck: ${rec.serviceTruck.name}` : null,
    '',
    'Before you work: park clear of traffic, hazards on, warning devices out, and follow your local rules and company practice.',
    'Open the call in Wayside on your phone (My calls) once it has synced.',
  ].filter((l): l is string => l !== null)
  const subject = `Call #${rec.number}: ${rec.customer.name}${u ? `, unit ${u.unitNumber}` : ''} at ${rec.locationText}`.slice(0, 200)
  return queueNotice({
    kind: 'call_assigned', to: rec.mechanic.email, subject, text: lines.join('\n'), related: { type: 'call', id: rec.id }, queuedBy: user,
  }, tx)
}

/** Tells the mechanic a call of theirs is off, so nobody drives out for nothing. */
export async function queueCancellationMail(tx: Tx, callId: string, user: User | null): Promise<NoticeResult> {
  const rec = await callForNotice(tx, callId)
  if (!rec?.mechanic) return { queued: false, reason: 'no mechanic' }
  return queueNotice({
    kind: 'call_cancelled', to: rec.mechanic.email, queuedBy: user, related: { type: 'call', id: rec.id },
    subject: `Call #${rec.number} cancelled: ${rec.customer.name}`.slice(0, 200),
    text: [`Call #${rec.number} (${rec.customer.name}, ${rec.locationText}) is cancelled.`,
      `Reason: ${rec.cancelReason ?? 'not given'}`, '', 'No need to drive out for it.'].join('\n'),
  }, tx)
}
