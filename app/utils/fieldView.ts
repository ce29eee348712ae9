// Small facts about a call that several phone screens need.
import { isLockedStatus } from '#shared/utils/callStatus'
import type { DeviceRow } from './fieldDb'

/** Billed, paid or cancelled calls take no more field changes (the server would refuse them). */
export function isCallClosed(call: DeviceRow): boolean {
  return isLockedStatus(String(call.status))
}

/** When a record was made: the device time for the phone's own, else the server's. */
export function recordTime(r: DeviceRow): string {
  return String(r.deviceAt ?? r.createdAt ?? '')
}

export function shortTime(iso: string): string {
  const d = new Date(iso)
  return Number.isNaN(d.getTime()) ? '' : d.toLocaleString([], { month: 'short', day: 'numeric', hour: '2-digit', minute: '2-digit' })
}
