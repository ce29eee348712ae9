// What puts a call at the top of the dispatch board and what turns its row red. Pure, so the
// board's table, its lanes and its phone-sized list order and mark calls the same way.
import { STATUS_ORDER, type CallStatus } from './callStatus'

/** Minutes an unassigned call may wait before the board raises it (common practice for road service). */
export const UNASSIGNED_ALARM_MINUTES = 15
/** Default minutes an assignment may go without the mechanic acting on it (the rates hold the business's own). */
export const DEFAULT_ASSIGNMENT_ALARM_MINUTES = 10

export type BoardUrgencyCall = {
  status: CallStatus
  derate: string
  receivedAt: string | Date
  assignedAt?: string | Date | null
  enRouteAt?: string | Date | null
  /** The mechanic asked the fleet for more and nobody has answered yet. */
  awaitingApproval?: boolean
}

/** A countdown or a shutdown strands the truck soonest: those calls go first. */
export function isEngineUrgent(c: Pick<BoardUrgencyCall, 'derate'>): boolean {
  return c.derate === 'countdown' || c.derate === 'shutdown'
}

export type BoardAlarm = { kind: 'unassigned' | 'unacted', minutes: number, words: string }

const ms = (d: string | Date) => new Date(d).getTime()

/**
 * Why the board should raise this call now, or null: waiting for a mechanic too long, or assigned
 * and not yet driven out to within `assignmentMinutes` (a paused call, one driven out to before,
 * does not count: its mechanic is busy elsewhere, which the board says otherwise).
 */
export function boardAlarm(c: BoardUrgencyCall, now: number, assignmentMinutes = DEFAULT_ASSIGNMENT_ALARM_MINUTES): BoardAlarm | null {
  if (c.status === 'received') {
    const minutes = Math.floor((now - ms(c.receivedAt)) / 60_000)
    return minutes > UNASSIGNED_ALARM_MINUTES ? { kind: 'unassigned', minutes, words: `No mechanic for ${minutes} min` } : null
  }
  if (c.status === 'assigned' && c.assignedAt && !c.enRouteAt) {
    const minutes = Math.floor((now - ms(c.assignedAt)) / 60_000)
    return minutes > assignmentMinutes ? { kind: 'unacted', minutes, words: `Not started ${minutes} min after assigning` } : null
  }
  return null
}

/** A call assigned, driven out to before, and now waiting: its mechanic paused it for another call. */
export function isPausedCall(c: BoardUrgencyCall): boolean {
  return c.status === 'assigned' && !!c.enRouteAt
}

/** Board order: countdown and shutdown first, then along the status order, then the oldest first. */
export function compareBoardCalls(a: BoardUrgencyCall, b: BoardUrgencyCall): number {
  // A call waiting for the fleet's approval comes first: the mechanic is stopped until someone answers.
  const waiting = Number(!!b.awaitingApproval) - Number(!!a.awaitingApproval)
  if (waiting) return waiting
  const urgent = Number(isEngineUrgent(b)) - Number(isEngineUrgent(a))
  if (urgent) return urgent
  const status = STATUS_ORDER.indexOf(a.status) - STATUS_ORDER.indexOf(b.status)
  return status || ms(a.receivedAt) - ms(b.receivedAt)
}
