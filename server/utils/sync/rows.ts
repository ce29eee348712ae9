// The row a create op writes: every column set (so a repeated create compares completely), the
// server's own judgement added (a reading's verdict, a clock event's flag, a part's stock price),
// or the reason the op is refused when it points at something that is not there.
import type { Op } from '#shared/schemas/sync'
import type { RecordCreate, RecordEntityName } from '#shared/sync/entities'
import { boundedMoveTime, clockBoundFlag } from '#shared/sync/clockBounds'
import { judge } from '#shared/utils/spec'
import type { ApplyContext } from './context'

export type CreateRow = Record<string, unknown> & { id: string, callId: string }

/** A date field as the device sent it (an ISO string), or null. */
export const toSyncDate = (v: unknown) => (typeof v === 'string' ? new Date(v) : null)
const toDate = toSyncDate

/** Written out field by field: object spread in this hot path costs more than the insert. */
export function buildCreateRow(ctx: ApplyContext, entity: RecordEntityName, op: Op, data: Record<string, unknown>): CreateRow | string {
  const id = op.entityId
  const callId = data.callId as string
  const createdBy = ctx.user.id
  const deviceAt = new Date(op.at)
  const { refs } = ctx
  switch (entity) {
    case 'reading': {
      const d = data as RecordCreate<'reading'>
      if (d.testRunId && refs.testRuns.get(d.testRunId) !== d.callId) return 'testRunId: no such test run on this call'
      let verdict = d.verdict ?? null
      // The server judges again when the spec is one it can read; the device's verdict is a hint.
      if (d.spec) {
        try {
          verdict = judge(d.value, d.spec)
        }
        catch { /* a spec the judge cannot read leaves the device's verdict */ }
      }
      return {
        id, callId, createdBy, deviceAt, testRunId: d.testRunId ?? null, stepId: d.stepId ?? null, label: d.label,
        quantity: d.quantity, value: d.value, unit: d.unit, component: d.component ?? null, pins: d.pins ?? null,
        conditions: d.conditions ?? null, partRole: d.partRole ?? null, spec: d.spec ?? null, verdict,
      }
    }
    case 'faultCode': {
      const d = data as RecordCreate<'faultCode'>
      return {
        id, callId, createdBy, deviceAt, code: d.code ?? null, spn: d.spn ?? null, fmi: d.fmi ?? null, state: d.state ?? 'active',
        count: d.count ?? 1, source: d.source ?? null, clearedAt: toDate(d.clearedAt), note: d.note ?? null,
      }
    }
    case 'note': return { id, callId, createdBy, deviceAt, text: (data as RecordCreate<'note'>).text }
    case 'clockEvent': {
      // The phone's time is kept (labor is priced from it); the server flags it when out of bounds.
      const flag = clockBoundFlag(deviceAt, { takenAt: ctx.calls.get(callId)!.receivedAt, now: ctx.now })
      return { id, callId, createdBy, deviceAt, kind: (data as RecordCreate<'clockEvent'>).kind, flag }
    }
    case 'photo': {
      const d = data as RecordCreate<'photo'>
      const max = ctx.limits.photoMaxBytes
      if (d.sizeBytes > max) return `sizeBytes: larger than the ${max}-byte photo limit`
      const { sha256, contentType, sizeBytes } = d
      return { id, callId, createdBy, deviceAt, sha256, contentType, sizeBytes, caption: d.caption ?? null }
    }
    case 'partLine': {
      const d = data as RecordCreate<'partLine'>
      if (d.serviceTruckId && !refs.trucks.has(d.serviceTruckId)) return 'serviceTruckId: no such service truck'
      const stock = d.serviceTruckId ? refs.stock.get(`${d.serviceTruckId}:${d.partNumber}`) : undefined
      return {
        id, callId, createdBy, deviceAt, partNumber: d.partNumber, description: d.description, quantity: d.quantity,
        unitPriceCents: d.unitPriceCents ?? stock?.unitPriceCents ?? 0, coreChargeCents: d.coreChargeCents ?? stock?.coreChargeCents ?? 0,
        serviceTruckId: d.serviceTruckId ?? null,
      }
    }
    case 'testRun': {
      const d = data as RecordCreate<'testRun'>
      if (!refs.cardVersions.has(`${d.cardId}:${d.cardVersion}`)) return 'cardVersion: no such version of this test card'
      return {
        id, callId, createdBy, deviceAt, cardId: d.cardId, cardVersion: d.cardVersion, ambientC: d.ambientC ?? null, steps: d.steps,
        conclusion: d.conclusion ?? null, finishedAt: toDate(d.finishedAt),
      }
    }
    case 'signOff': {
      const d = data as RecordCreate<'signOff'>
      return { id, callId, createdBy, deviceAt, driverName: d.driverName, signature: d.signature }
    }
    case 'approvalRequest': {
      const d = data as RecordCreate<'approvalRequest'>
      return {
        id, callId, createdBy, deviceAt, diagnosis: d.diagnosis, needed: d.needed ?? null, plannedLaborMinutes: d.plannedLaborMinutes,
        plannedParts: d.plannedParts, estimateCents: d.estimateCents, limitCents: d.limitCents, photoIds: d.photoIds,
      }
    }
    case 'estimateSignature': {
      const d = data as RecordCreate<'estimateSignature'>
      // Signed at the phone's time, kept between the call being taken and the server's now.
      const signedAt = boundedMoveTime(deviceAt, { after: ctx.calls.get(callId)!.receivedAt, now: ctx.now })
      return {
        id, callId, createdBy, deviceAt, driverName: d.driverName, signature: d.signature, work: d.work,
        plannedLaborMinutes: d.plannedLaborMinutes, plannedParts: d.plannedParts, lines: d.lines, taxCents: d.taxCents,
        amountCents: d.amountCents, signedAt,
      }
    }
  }
}
