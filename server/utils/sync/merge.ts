// The three-way, per-field merge of a call update from a device (DESIGN.md, "Sync protocol").
// Pure: no database, no Nitro globals, so unit tests import it directly.
import {
  CALL_FIELD_WRITERS, callFieldOwner, canMoveStatus, FIELD_STATUS_TARGETS, isBilledStatus, isLockedStatus, isPauseMove, STATUS_LABELS,
  statusRank,
  type CallStatus,
} from '#shared/utils/callStatus'
import type { Role } from '#shared/utils/roles'

export interface MergeInput {
  field: string
  device: unknown
  server: unknown
  /** The field's value at the device's baseVersion, when the op carried one. */
  base?: { value: unknown }
  /** Whether the op's baseVersion equals the row's version now (decides a field sent without base). */
  baseVersionMatches?: boolean
  role: Role
  /** The call's status on the server now. */
  serverStatus: CallStatus
}

export type MergeDecision
  = | { action: 'take', value: unknown } // write the device value
    | { action: 'same' } // already equal: nothing to do
    | { action: 'keep', reason: string } // server keeps its value; nothing to settle (a stale status)
    | { action: 'conflict', reason: string } // server keeps its value; a person settles it
    | { action: 'reject', reason: string } // the op may not carry this field

export function mergeCallField(input: MergeInput): MergeDecision {
  const { field, device, server, role, serverStatus } = input
  const owner = callFieldOwner(field)
  if (!owner) return { action: 'reject', reason: `${field}: not a field of a call` }
  if (owner === 'link') return { action: 'reject', reason: `${field}: set on the call screens, not by sync` }
  if (!CALL_FIELD_WRITERS[owner].includes(role)) {
    const kind = owner === 'dispatch' ? 'dispatch' : 'field-work'
    return { action: 'reject', reason: `${field}: a ${kind} field; a ${role} may not change it` }
  }
  if (field === 'status' && !FIELD_STATUS_TARGETS[role].includes(device as CallStatus) && !sameSyncValue(device, server)) {
    return { action: 'reject', reason: `status: a ${role} may not move a call to ${String(device)} by sync` }
  }
  if (sameSyncValue(device, server)) return { action: 'same' }
  if (isLockedStatus(serverStatus)) return { action: 'conflict', reason: lockedReason(field, serverStatus) }
  if (field === 'status') return mergeStatus(serverStatus, device as CallStatus)
  if (input.base) {
    if (sameSyncValue(input.base.value, server)) return { action: 'take', value: device }
    return { action: 'conflict', reason: `${field}: changed on the server since the device saw it` }
  }
  if (input.baseVersionMatches) return { action: 'take', value: device }
  return { action: 'conflict', reason: `${field}: sent without its base value and the call changed since` }
}

/** Why a locked call keeps its value: billed (an invoice was priced from it) or cancelled. */
export function lockedReason(field: string, status: CallStatus): string {
  if (isBilledStatus(status)) return `${field}: the call is ${status} and takes no more field changes`
  return field === 'status' ? 'status: the call was cancelled' : `${field}: the call was cancelled and takes no more field changes`
}

/**
 * Status moves ignore base: the order itself decides, and a stale move never drags a call back. A
 * pause (en route or at the truck → assigned) is the one back move taken: the phone sends it only
 * when its mechanic starts on another call; a call already done keeps its status (below).
 */
function mergeStatus(from: CallStatus, to: CallStatus): MergeDecision {
  if (isPauseMove(from, to)) return { action: 'take', value: to }
  if (to === 'assigned' && statusRank(from) < statusRank(to)) {
    return { action: 'reject', reason: 'status: a call is assigned on the dispatch board; sync moves it to assigned only as a pause' }
  }
  if (canMoveStatus(from, to)) return { action: 'take', value: to }
  if (to === 'cancelled') {
    return { action: 'conflict', reason: `status: a call that is ${STATUS_LABELS[from].toLowerCase()} cannot be cancelled` }
  }
  if (statusRank(to) < statusRank(from)) {
    return { action: 'keep', reason: `status: the call is already ${STATUS_LABELS[from].toLowerCase()}; sync never moves a status back` }
  }
  return { action: 'conflict', reason: `status: ${from} to ${to} does not follow the status order` }
}

/** Value equality as JSON sees it: key order, Dates and undefined-vs-null do not matter. */
export function sameSyncValue(a: unknown, b: unknown): boolean {
  return stableSyncJson(a) === stableSyncJson(b)
}

export function stableSyncJson(v: unknown): string {
  return JSON.stringify(normalize(v))
}

function normalize(v: unknown): unknown {
  if (v === undefined || v === null) return null
  if (v instanceof Date) return v.toISOString()
  if (Array.isArray(v)) return v.map(normalize)
  if (typeof v === 'object') {
    const out: Record<string, unknown> = {}
    for (const k of Object.keys(v as object).sort()) {
      const x = (v as Record<string, unknown>)[k]
      if (x !== undefined) out[k] = normalize(x)
    }
    return out
  }
  return v
}
