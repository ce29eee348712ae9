// Comebacks: the same fault code on the same unit again within a window (30 days by default)
// after an earlier call. A shop counts these because they usually mean the first fix missed.
// Pure and unit-tested; the unit page flags comebacks with it.

import { faultCodeKey } from './faultMatch'

export const COMEBACK_WINDOW_DAYS = 30
const DAY_MS = 86_400_000

export interface ComebackFaultCode { code?: string | null, spn?: number | null, fmi?: number | null }
export interface ComebackCall { id: string, at: Date | string | number, faultCodes: readonly ComebackFaultCode[] }
export interface Comeback { callId: string, earlierCallId: string, code: string, days: number }

// One key per fault code (shared with the diagnostics' history): 'p0117 ' and 'P0117' match, and
// a J1939 code is its SPN and FMI together (the same SPN with another failure mode is another
// fault). A code that cannot be read gives no key and is left out.
function keyOf(fc: ComebackFaultCode): string | null {
  try {
    return faultCodeKey(fc)
  }
  catch { return null }
}

function timeOf(at: Date | string | number): number {
  const t = at instanceof Date ? at.getTime() : typeof at === 'number' ? at : Date.parse(at)
  if (!Number.isFinite(t)) throw new RangeError(`Not a usable call time: ${String(at)}`)
  return t
}

/**
 * Every comeback among one unit's calls: for each later call and each of its fault codes, the
 * nearest earlier call with the same code no more than `windowDays` before it (the limit itself
 * counts as within). Calls may come in any order.
 */
export function findComebacks(calls: readonly ComebackCall[], windowDays = COMEBACK_WINDOW_DAYS): Comeback[] {
  if (!(windowDays >= 0) || !Number.isFinite(windowDays)) throw new RangeError(`Window must be 0 days or more, got ${windowDays}`)
  const sorted = calls.map(c => ({ c, t: timeOf(c.at) })).sort((a, b) => a.t - b.t)
  const lastSeen = new Map<string, { id: string, t: number }>()
  const out: Comeback[] = []
  for (const { c, t } of sorted) {
    const keys = new Set(c.faultCodes.map(keyOf).filter((k): k is string => k !== null))
    for (const key of keys) {
      const prev = lastSeen.get(key)
      if (prev && prev.id !== c.id && prev.t < t && t - prev.t <= windowDays * DAY_MS) {
        out.push({ callId: c.id, earlierCallId: prev.id, code: key, days: (t - prev.t) / DAY_MS })
      }
    }
    for (const key of keys) lastSeen.set(key, { id: c.id, t })
  }
  return out
}
