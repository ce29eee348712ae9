import type { FaultHistoryEntry } from '#shared/utils/faultMatch'

/**
 * The fault codes recorded on every call of this call's unit that is on the phone, as the
 * history the 'returned' rule (returnedFaultCodes) reads. Works with no signal.
 */
export async function unitFaultHistory(callId: string): Promise<FaultHistoryEntry[]> {
  const bundles = await readBundles()
  const unitId = bundles.find(b => b.id === callId)?.call.unitId
  const mine = bundles.filter(b => b.id === callId || (unitId && b.call.unitId === unitId))
  return mine.flatMap(b => Object.values(b.records.faultCodes ?? {}).map(f => ({
    id: f.id, callId: b.id,
    code: typeof f.code === 'string' ? f.code : null,
    spn: typeof f.spn === 'number' ? f.spn : null,
    fmi: typeof f.fmi === 'number' ? f.fmi : null,
    seenAt: String(f.deviceAt ?? f.createdAt ?? b.call.receivedAt ?? new Date(0).toISOString()),
    clearedAt: typeof f.clearedAt === 'string' ? f.clearedAt : null,
  })))
}
