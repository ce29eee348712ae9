import type { CallOutcome, CallStatus } from '../schemas/calls'

/** The order a call moves through; `cancelled` sits outside it. */
export const STATUS_ORDER: CallStatus[] = ['received', 'assigned', 'en_route', 'on_site', 'completed', 'invoiced', 'paid']

export const STATUS_LABELS: Record<CallStatus, string> = {
  received: 'Waiting for a mechanic',
  assigned: 'Assigned',
  en_route: 'Driving out',
  on_site: 'At the truck',
  completed: 'Work done',
  invoiced: 'Billed',
  paid: 'Paid',
  cancelled: 'Cancelled',
}

export const OUTCOME_LABELS: Record<CallOutcome, string> = {
  repaired: 'Repaired at the roadside',
  towed: 'Towed in',
  parts_ordered: 'Parts ordered, return visit',
  no_fault_found: 'No fault found',
}

/** Rank in the status order, or -1 for cancelled. */
export function statusRank(s: CallStatus): number {
  return STATUS_ORDER.indexOf(s)
}

/** Whether moving `from` → `to` follows the order (forward only; cancel only before completion). */
export function canMoveStatus(from: CallStatus, to: CallStatus): boolean {
  if (from === to) return true
  if (from === 'cancelled') return false
  if (to === 'cancelled') return statusRank(from) < statusRank('completed')
  return statusRank(to) > statusRank(from)
}

/** Invoiced and paid calls are closed to field changes. */
export function isLockedStatus(s: CallStatus): boolean {
  return s === 'invoiced' || s === 'paid'
}
