// The fleet's status link (`/s/<token>`): made by the office, opened by anyone who has it, closed
// when the call is paid, when it runs out or when the office turns it off. What it shows is
// fleetStatusView (server/utils/fleetStatus.ts), never the call record.
import { eq } from 'drizzle-orm'
import type { User } from '#auth-utils'

export const STATUS_LINK_PATH = '/s/'
/** Days a status link lasts when no rates are set. */
export const STATUS_LINK_DEFAULT_DAYS = 14

type CallRow = typeof tables.calls.$inferSelect

export function statusLinkUrl(token: string) {
  return linkUrl(STATUS_LINK_PATH, token)
}

/** A new status link for the call; e-mailed in the same transaction when `sendTo` is given. */
export async function makeStatusLink(call: CallRow, user: User, sendTo?: string) {
  if (call.status === 'paid') ruleError('status', 'The call is paid; a status link would not open any more')
  const rates = await ratesInForce()
  const days = rates?.statusLinkDays ?? STATUS_LINK_DEFAULT_DAYS
  const expiresAt = new Date(Date.now() + days * 86_400_000)
  return useDb().transaction(async (tx) => {
    const link = await makeLink({ purpose: 'call_status', subjectId: call.id, expiresAt, createdBy: user.id }, tx)
    const url = statusLinkUrl(link.token)
    if (sendTo) {
      await queueStatusLinkMail(call, url, link.expiresAt, sendTo, user, rates?.businessName || 'Road service', tx)
      await tx.insert(tables.callEvents).values({ callId: call.id, kind: 'status_link_sent', byUserId: user.id,
        note: `Status link e-mailed to ${sendTo}` })
    }
    return { url, expiresAt: link.expiresAt }
  })
}

async function queueStatusLinkMail(call: CallRow, url: string, expiresAt: Date, to: string, user: User, business: string, tx: Tx) {
  const [unit] = call.unitId
    ? await tx.select({ unitNumber: tables.units.unitNumber }).from(tables.units).where(eq(tables.units.id, call.unitId))
    : []
  const what = unit ? `unit ${unit.unitNumber}` : `road call #${call.number}`
  const until = expiresAt.toISOString().slice(0, 10)
  const text = [
    'Hello,', '',
    `You can follow ${what} (road call #${call.number}) on this page, from your phone or any browser, without signing in:`,
    url, '',
    'It shows where the call stands, roughly when the mechanic should arrive, and what was found and done once the work is finished.',
    `The link works until the call is paid, or until ${until} at the latest.`,
    'Anyone who has it can open it, so share it only with your own people.',
    '', 'Thank you,', business,
  ].join('\n')
  await queueMail({ kind: 'status_link', to, subject: `Road call #${call.number}: follow ${what}`, text,
    related: { type: 'call', id: call.id }, queuedBy: user }, tx)
}

/** The panel's state: how many links work now and until when (tokens are not kept, so never the link itself). */
export async function statusLinkState(callId: string) {
  const live = await liveLinkFor('call_status', callId)
  return { live: live ? { createdAt: live.createdAt, expiresAt: live.expiresAt, lastOpenedAt: live.lastOpenedAt } : null }
}

/** The call a status token opens, or the one 404 (a paid call's link no longer opens). */
export async function callOfStatusLink(token: unknown) {
  const link = await requireLink('call_status', token)
  const call = await useDb().query.calls.findFirst({ where: eq(tables.calls.id, link.subjectId) })
  if (!call || call.status === 'paid') linkNotFound()
  await touchLink(link.id)
  return { link, call }
}
