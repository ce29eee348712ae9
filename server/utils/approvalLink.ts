// The fleet's approval link (`/a/<token>`): made by the office for one request of the mechanic's,
// opened by the fleet's contact without an account, and closed by the first answer to that request
// (on the page, or recorded by the office), by the call being billed or cancelled, or when it runs out.
// What the page shows is approvalLinkView: the request, the estimate and the request's photos.
import { and, eq, inArray } from 'drizzle-orm'
import type { User } from '#auth-utils'

export const APPROVAL_LINK_PATH = '/a/'
/** Hours an approval link works: the truck waits at the roadside, so the answer is wanted today. */
export const APPROVAL_LINK_HOURS = 48

type CallRow = typeof tables.calls.$inferSelect

/** A new link for the call's open request; e-mailed in the same transaction when `sendTo` is given. */
export async function makeApprovalLink(call: CallRow, user: User, sendTo?: string) {
  if (isLockedStatus(call.status)) ruleError('status', `The call is ${STATUS_LABELS[call.status].toLowerCase()}; it takes no approval`)
  const request = await openRequestOf(useDb(), call.id)
  if (!request) ruleError('requestId', 'The mechanic has not asked for more on this call; there is nothing for the fleet to answer')
  const expiresAt = new Date(Date.now() + APPROVAL_LINK_HOURS * 3_600_000)
  const rates = await ratesInForce()
  return useDb().transaction(async (tx) => {
    const link = await makeLink({ purpose: 'estimate_approval', subjectId: request.id, expiresAt, createdBy: user.id }, tx)
    const url = linkUrl(APPROVAL_LINK_PATH, link.token)
    if (sendTo) {
      const business = rates?.businessName || 'Road service'
      const soFar = request.limitCents != null ? ` (approved so far: ${formatCents(request.limitCents)})` : ''
      const text = [
        'Hello,', '',
        `Our mechanic on road call #${call.number} needs your approval before doing more work.`,
        `Found: ${request.diagnosis}`,
        `New estimated total: ${formatCents(request.estimateCents)}${soFar}.`,
        '', 'See the estimate and the photos, and approve or decline, on this page (no sign-in needed):', url, '',
        `The link works once, until ${expiresAt.toISOString().slice(0, 16).replace('T', ' ')} UTC.`,
        'Anyone who has it can answer, so share it only with whoever may approve repairs.',
        '', 'Thank you,', business,
      ].join('\n')
      await queueMail({ kind: 'approval_link', to: sendTo, subject: `Road call #${call.number}: approval needed`, text,
        related: { type: 'call', id: call.id }, queuedBy: user }, tx)
      await tx.insert(tables.callEvents).values({ callId: call.id, kind: 'approval_link_sent', byUserId: user.id,
        note: `Approval link e-mailed to ${sendTo}` })
    }
    return { url, expiresAt: link.expiresAt, requestId: request.id }
  })
}

/** The request and call a token opens, or the one 404 (answered, billed, cancelled, expired, revoked, unknown). */
export async function requestOfApprovalLink(token: unknown) {
  const link = await requireLink('estimate_approval', token)
  const db = useDb()
  const request = await db.query.approvalRequests.findFirst({ where: eq(tables.approvalRequests.id, link.subjectId) })
  if (!request) linkNotFound()
  const call = await db.query.calls.findFirst({ where: eq(tables.calls.id, request.callId) })
  const open = await openRequestOf(db, request.callId)
  if (!call || isLockedStatus(call.status) || open?.id !== request.id) linkNotFound()
  await touchLink(link.id)
  return { link, request, call }
}

/** What the fleet's page shows: the call in brief, the request, the estimate priced like the invoice, the photos. */
export async function approvalLinkView(token: string, call: CallRow, request: typeof tables.approvalRequests.$inferSelect) {
  const db = useDb()
  const [customer] = await db.select().from(tables.customers).where(eq(tables.customers.id, call.customerId))
  const [unit] = call.unitId ? await db.select().from(tables.units).where(eq(tables.units.id, call.unitId)) : []
  const rates = await ratesInForce()
  let estimate = null
  if (rates) {
    const record = await estimateRecordFor(db, call, rates, customer?.taxExempt ?? false)
    const plan = { laborMinutes: request.plannedLaborMinutes, parts: request.plannedParts }
    const e = estimateCall(record, call.authLimitCents, plan)
    estimate = {
      sofarCents: e.sofar.totalCents,
      lines: e.expected.lines.map(l => ({
        key: l.key, description: l.description, amountCents: l.amountCents, planned: !!l.source.planned,
      })),
      subtotalCents: e.expected.subtotalCents, taxCents: e.expected.taxCents, totalCents: e.expected.totalCents,
    }
  }
  const ids = request.photoIds.length ? request.photoIds : []
  const photos = ids.length
    ? await db.select({ id: tables.photos.id, caption: tables.photos.caption, storageKey: tables.photos.storageKey }).from(tables.photos)
        .where(and(eq(tables.photos.callId, call.id), inArray(tables.photos.id, ids)))
    : []
  const u = tables.users
  const [mech] = call.mechanicId ? await db.select({ name: u.name }).from(u).where(eq(u.id, call.mechanicId)) : []
  return {
    business: rates?.businessName || 'Road service',
    callNumber: call.number,
    customer: customer?.name ?? null,
    unit: unit ? { number: unit.unitNumber, vin: unit.vin, description: unit.yearMakeModel } : null,
    complaint: call.complaint,
    mechanic: mech?.name.split(/\s+/)[0] ?? null,
    limitCents: call.authLimitCents,
    poNumber: call.poNumber,
    request: {
      id: request.id, diagnosis: request.diagnosis, needed: request.needed, plannedLaborMinutes: request.plannedLaborMinutes,
      plannedParts: request.plannedParts, estimateCents: request.estimateCents, limitCents: request.limitCents,
      askedAt: (request.deviceAt ?? request.createdAt).toISOString(),
    },
    estimate,
    photos: photos.filter(p => p.storageKey).map(p => ({ id: p.id, caption: p.caption, url: `/api/approve/${token}/photos/${p.id}` })),
  }
}

/** A photo of the request, through its link. */
export async function approvalLinkPhoto(requestPhotoIds: string[], photoId: string) {
  if (!requestPhotoIds.includes(photoId)) linkNotFound()
  const [photo] = await useDb().select().from(tables.photos).where(eq(tables.photos.id, photoId))
  if (!photo?.storageKey) linkNotFound()
  const raw = await useStorage('uploads').getItemRaw(photo.storageKey)
  if (!raw) linkNotFound()
  const bytes = Buffer.isBuffer(raw) ? raw : Buffer.from(raw as ArrayBuffer)
  return { bytes, contentType: photo.contentType ?? 'application/octet-stream' }
}
