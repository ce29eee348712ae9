// The service report's content: what the fleet is told about the work, before any bill. Never a
// price; free text passes through redactContact, since the report also opens from the status link.
import { and, asc, eq, inArray } from 'drizzle-orm'
import type { User } from '#auth-utils'
import type { StoredSpec } from '#shared/utils/readingFormat'

/** Whether the call's record is whole on the server: done, nothing left to settle, every photo uploaded. */
export async function reportReadiness(call: typeof tables.calls.$inferSelect): Promise<string | null> {
  if (!isDoneStatus(call.status)) return 'The report is made once the work is finished'
  const db = useDb()
  const [open] = await db.select({ id: tables.conflicts.id }).from(tables.conflicts)
    .where(and(eq(tables.conflicts.callId, call.id), eq(tables.conflicts.status, 'open'))).limit(1)
  if (open) return 'The call has changes to settle first'
  const waiting = await db.select({ id: tables.photos.id, uploadedAt: tables.photos.uploadedAt }).from(tables.photos)
    .where(eq(tables.photos.callId, call.id))
  if (waiting.some(p => !p.uploadedAt)) return 'Some photos have not arrived from the phone yet'
  return null
}

export async function serviceReportFacts(callId: string) {
  const db = useDb()
  const call = await db.query.calls.findFirst({
    where: eq(tables.calls.id, callId),
    with: {
      customer: { columns: { name: true } },
      unit: true,
      faultCodes: { orderBy: t => [asc(t.createdAt)] },
      readings: { orderBy: t => [asc(t.createdAt)] },
      testRuns: { orderBy: t => [asc(t.createdAt)] },
      signOffs: true,
    },
  })
  if (!call) return null
  const rates = await ratesInForce()
  const [mechanic] = call.mechanicId
    ? await db.select({ name: tables.users.name }).from(tables.users).where(eq(tables.users.id, call.mechanicId))
    : []
  const cardIds = [...new Set(call.testRuns.map(r => r.cardId))]
  const cards = cardIds.length
    ? await db.select({ id: tables.testCards.id, title: tables.testCards.title }).from(tables.testCards)
        .where(inArray(tables.testCards.id, cardIds))
    : []
  const zone = rates?.timeZone ?? 'UTC'
  const day = (d: Date) => new Intl.DateTimeFormat('en-CA', { timeZone: zone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(d)
  const signOff = call.signOffs[0]
  return {
    business: rates?.businessName || 'Road service',
    number: call.number,
    customer: call.customer.name,
    serviceDate: day(call.onSiteAt ?? call.completedAt ?? call.receivedAt),
    completedOn: call.completedAt ? day(call.completedAt) : null,
    mechanic: mechanic?.name ?? null,
    location: call.locationText,
    outcome: call.outcome ? OUTCOME_LABELS[call.outcome] : null,
    unit: call.unit
      ? {
          number: call.unit.unitNumber, description: call.unit.yearMakeModel, vin: call.unit.vin,
          // The reading taken at the truck on this call, else the unit's last known.
          odometer: odometerShown(call, call.unit), engineHours: engineHoursShown(call, call.unit),
        }
      : null,
    story: {
      complaint: redactContact(call.storyComplaint ?? call.complaint), cause: redactContact(call.storyCause),
      correction: redactContact(call.storyCorrection),
    },
    faultCodes: call.faultCodes.map((f) => {
      const d = describeFaultCodeSafe(f)
      const meaning = 'problem' in d ? null : d.meaning ?? ([d.spnName, d.fmiText].filter(Boolean).join(': ') || d.group || null)
      return { code: d.label, meaning, state: f.clearedAt ? 'cleared' : f.state }
    }),
    readings: call.readings.map(r => ({ label: r.label, ...formatReading({ ...r, spec: r.spec as StoredSpec | null }) })),
    tests: call.testRuns.filter(r => r.conclusion).map(r => ({
      title: cards.find(c => c.id === r.cardId)?.title ?? 'Test', conclusion: redactContact(r.conclusion!),
    })),
    verification: verificationView(call.verification),
    followUp: redactContact(call.followUp),
    signOff: signOff
      ? { driverName: signOff.driverName, signature: signOff.signature, at: day(signOff.deviceAt ?? signOff.createdAt) }
      : null,
    images: await markedPhotoImages(call.id),
  }
}

export type ServiceReportFacts = NonNullable<Awaited<ReturnType<typeof serviceReportFacts>>>

export function serviceReportFilename(r: Pick<ServiceReportFacts, 'number'>) {
  return `service-report-call-${r.number}.pdf`
}

/**
 * E-mails the report to the fleet through the mail queue (the PDF is made when the job sends) and
 * notes it on the call's timeline, in one transaction. Only a finished call whose record is whole.
 */
export async function sendServiceReport(call: typeof tables.calls.$inferSelect, to: string, user: User) {
  const problem = await reportReadiness(call)
  if (problem) ruleError('status', problem)
  const rates = await ratesInForce()
  const business = rates?.businessName || 'Road service'
  const [unit] = call.unitId
    ? await useDb().select({ unitNumber: tables.units.unitNumber }).from(tables.units).where(eq(tables.units.id, call.unitId))
    : []
  const what = unit ? `unit ${unit.unitNumber}` : 'your unit'
  const text = [
    'Hello,', '',
    `Attached is the service report for road call #${call.number} on ${what}: what was reported, what the mechanic found and`,
    'measured, what was done, and the driver\'s sign-off. The invoice follows separately.', '',
    'Thank you,', business,
  ].join('\n')
  return useDb().transaction(async (tx) => {
    const mail = await queueMail({
      kind: 'service_report', to, subject: `Road call #${call.number}: service report for ${what}`, text,
      attachments: [{ make: 'service-report-pdf', id: call.id }], related: { type: 'call', id: call.id }, queuedBy: user,
    }, tx)
    await tx.insert(tables.callEvents).values({ callId: call.id, kind: 'report_sent', byUserId: user.id,
      note: `Service report e-mailed to ${to}` })
    return { queued: true, mailId: mail.id, to }
  })
}
