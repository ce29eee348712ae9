// Labor and travel time come from the mechanic's clock events, never typed: travel runs from
// travel_start to arrive, labor from work_start to work_stop. The device's clock times the events
// (the server only learns of them at sync, perhaps hours later).

export type ClockTotalsKind = 'travel_start' | 'arrive' | 'work_start' | 'work_stop' | 'depart'
export interface ClockTotalsEvent { kind: ClockTotalsKind; at: Date | string | number }
export interface ClockTotals {
  travelMinutes: number
  laborMinutes: number
  /** Travel or work started and not yet stopped; counted up to `now` when given. */
  travelRunning: boolean
  workRunning: boolean
}

const ms = (at: Date | string | number) => (at instanceof Date ? at.getTime() : typeof at === 'number' ? at : Date.parse(at))

/**
 * Sums the travel and work intervals. A repeated start while already running is ignored (a double
 * tap), as is a stop with nothing running; `depart` also ends work left running.
 */
export function clockTotals(events: readonly ClockTotalsEvent[], now?: Date | number): ClockTotals {
  const sorted = events.map(e => ({ kind: e.kind, t: ms(e.at) })).filter(e => Number.isFinite(e.t)).sort((a, b) => a.t - b.t)
  let travel = 0, labor = 0
  let travelFrom: number | null = null, workFrom: number | null = null
  for (const e of sorted) {
    if (e.kind === 'travel_start') travelFrom ??= e.t
    else if (e.kind === 'arrive') {
      if (travelFrom !== null) travel += e.t - travelFrom
      travelFrom = null
    }
    else if (e.kind === 'work_start') workFrom ??= e.t
    else if (e.kind === 'work_stop' || e.kind === 'depart') {
      if (workFrom !== null) labor += e.t - workFrom
      workFrom = null
    }
  }
  const end = now === undefined ? null : ms(now)
  if (end !== null && travelFrom !== null && end > travelFrom) travel += end - travelFrom
  if (end !== null && workFrom !== null && end > workFrom) labor += end - workFrom
  return { travelMinutes: travel / 60_000, laborMinutes: labor / 60_000, travelRunning: travelFrom !== null, workRunning: workFrom !== null }
}
