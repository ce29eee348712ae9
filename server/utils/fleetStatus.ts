// What the fleet's status page shows, built field by field from what the office releases:
// - always: the business's name, the call's number, the unit, the status in words and when each step was reached;
// - once a mechanic has it: the mechanic's first name; while driving out, a rough arrival in minutes
//   (from their last position and the average road speed, rounded; never the position itself);
// - once the work is done (completed or invoiced): the story, the fault codes with their meanings, the
//   test runs' conclusions, the verification and whether the driver signed, and the service report (a PDF
//   through the same token).
// Never prices, e-mail addresses, phone numbers, places, notes, other calls or people's full names;
// free text passes through redactContact.
import { asc, eq, inArray } from 'drizzle-orm'
import type { CallStatus } from '#shared/utils/callStatus'

const FLEET_STATUS_WORDS: Record<CallStatus, string> = {
  received: 'Call taken: a mechanic is being found',
  assigned: 'A mechanic has the call and is getting ready',
  en_route: 'The mechanic is driving out',
  on_site: 'The mechanic is at the truck',
  completed: 'The work is finished',
  invoiced: 'The work is finished',
  paid: 'The work is finished',
  cancelled: 'The call was cancelled',
}
const STEPS = ['received', 'assigned', 'en_route', 'on_site', 'completed'] as const satisfies readonly CallStatus[]
const STEP_WORDS: Record<(typeof STEPS)[number], string> = {
  received: 'Call taken', assigned: 'Mechanic assigned', en_route: 'Driving out', on_site: 'At the truck', completed: 'Work finished',
}

type CallRow = typeof tables.calls.$inferSelect

function faultWords(f: { code: string | null, spn: number | null, fmi: number | null }) {
  const d = describeFaultCodeSafe(f)
  const meaning = 'problem' in d ? null : d.meaning ?? ([d.spnName, d.fmiText].filter(Boolean).join(': ') || d.group || null)
  return { code: d.label, meaning: meaning ?? null }
}

/** The arrival estimate while the mechanic drives out, or null. */
type Position = { lastLat: number | null, lastLon: number | null, lastPositionAt: Date | null }
async function arrivalOf(call: CallRow, mechanic: Position | undefined, rates: Awaited<ReturnType<typeof ratesInForce>>) {
  if (call.status !== 'en_route' || !mechanic) return null
  const from = mechanic.lastLat != null && mechanic.lastLon != null ? { lat: mechanic.lastLat, lon: mechanic.lastLon } : null
  const to = call.lat != null && call.lon != null ? { lat: call.lat, lon: call.lon } : null
  const ageMin = mechanic.lastPositionAt ? (Date.now() - mechanic.lastPositionAt.getTime()) / 60_000 : null
  const eta = roughArrival(from, to, {
    averageKph: rates?.averageRoadKph ?? FALLBACK_ROAD_KPH, roadFactorPct: rates?.roadFactorPct ?? 100, positionAgeMin: ageMin,
  })
  return eta ? { ...eta, asOf: new Date().toISOString() } : null
}

/** The work as released once it is done. */
async function workOf(call: CallRow) {
  const db = useDb()
  const [codes, runs, signOffs] = await Promise.all([
    db.select().from(tables.faultCodes).where(eq(tables.faultCodes.callId, call.id)).orderBy(asc(tables.faultCodes.createdAt)),
    db.select().from(tables.testRuns).where(eq(tables.testRuns.callId, call.id)).orderBy(asc(tables.testRuns.createdAt)),
    db.select({ id: tables.signOffs.id }).from(tables.signOffs).where(eq(tables.signOffs.callId, call.id)),
  ])
  const cardIds = [...new Set(runs.map(r => r.cardId))]
  const cards = cardIds.length
    ? await db.select({ id: tables.testCards.id, title: tables.testCards.title }).from(tables.testCards)
        .where(inArray(tables.testCards.id, cardIds))
    : []
  const verification = verificationView(call.verification)
  return {
    outcome: call.outcome ? OUTCOME_LABELS[call.outcome] : null,
    story: {
      complaint: redactContact(call.storyComplaint), cause: redactContact(call.storyCause), correction: redactContact(call.storyCorrection),
    },
    faultCodes: codes.map(f => ({ ...faultWords(f), cleared: !!f.clearedAt })),
    tests: runs.filter(r => r.conclusion).map(r => ({
      title: cards.find(c => c.id === r.cardId)?.title ?? 'Test', conclusion: redactContact(r.conclusion!),
    })),
    verification: verification
      ? {
          passed: verification.passed, checks: verification.checks.map(c => ({ label: c.label, done: c.done })),
          testDrive: verification.testDrive ?? null,
        }
      : null,
    signedOff: signOffs.length > 0,
  }
}

/** The status page's whole answer for a call the link opened. */
export async function fleetStatusView(call: CallRow, token: string) {
  const db = useDb()
  const rates = await ratesInForce()
  const [unit] = call.unitId
    ? await db.select({ unitNumber: tables.units.unitNumber, yearMakeModel: tables.units.yearMakeModel }).from(tables.units)
        .where(eq(tables.units.id, call.unitId))
    : []
  const [mechanic] = call.mechanicId
    ? await db.select({ name: tables.users.name, lastLat: tables.users.lastLat, lastLon: tables.users.lastLon,
        lastPositionAt: tables.users.lastPositionAt }).from(tables.users).where(eq(tables.users.id, call.mechanicId))
    : []
  const cancelled = call.status === 'cancelled'
  const done = isDoneStatus(call.status)
  return {
    business: rates?.businessName || 'Road service',
    callNumber: call.number,
    status: call.status,
    statusWords: FLEET_STATUS_WORDS[call.status],
    unit: unit ? { number: unit.unitNumber, description: unit.yearMakeModel } : null,
    mechanicFirstName: !cancelled && mechanic ? mechanic.name.trim().split(/\s+/)[0] ?? null : null,
    arrival: await arrivalOf(call, mechanic, rates),
    steps: STEPS.map(s => ({ status: s, words: STEP_WORDS[s], at: call[STATUS_TIME_FIELD[s]] ?? null }))
      .filter(s => s.at !== null),
    work: done ? await workOf(call) : null,
    /** The service report through the same token, once the work is done. */
    reportUrl: done ? `/api/share/${token}/report.pdf` : null,
    updatedAt: new Date().toISOString(),
  }
}

export type FleetStatusView = Awaited<ReturnType<typeof fleetStatusView>>
