// Travel and labor spans from a call's clock events: what the office bills and what the phone shows
// running. Kept apart from the pricing (billing.ts) so the phone's screens load it without the
// calendar code the pricing needs.
export type ClockKind = 'travel_start' | 'arrive' | 'work_start' | 'work_stop' | 'depart' | 'pause'
export type BillingClockEvent = { id?: string, kind: ClockKind, at: string | Date, flag?: string | null }

export type Span = { start: number, end: number, ids: string[] }

/**
 * Travel and labor spans from the clock events, in order of time. Travel runs from travel_start to
 * arrive; labor from each work_start to the next work_stop (or depart). A pause (the mechanic
 * started on another call) ends either, so one mechanic never runs two clocks at once. An open span
 * counts up to `until`, so a running clock shows what has accrued so far.
 */
export function clockSpans(events: BillingClockEvent[], until: Date = new Date()): { travel: Span[], labor: Span[] } {
  const sorted = events.map(e => ({ kind: e.kind, id: e.id, t: new Date(e.at).getTime() }))
  for (const e of sorted) if (!Number.isFinite(e.t)) throw new RangeError(`clock event ${e.kind} has no valid time`)
  sorted.sort((a, b) => a.t - b.t)
  const travel: Span[] = [], labor: Span[] = []
  let travelFrom: typeof sorted[number] | null = null, workFrom: typeof sorted[number] | null = null
  const ids = (...xs: ({ id?: string } | null)[]) => xs.flatMap(x => (x?.id ? [x.id] : []))
  for (const e of sorted) {
    if (e.kind === 'travel_start') travelFrom ??= e
    else if (e.kind === 'arrive' && travelFrom) {
      travel.push({ start: travelFrom.t, end: e.t, ids: ids(travelFrom, e) })
      travelFrom = null
    }
    else if (e.kind === 'work_start') workFrom ??= e
    else if ((e.kind === 'work_stop' || e.kind === 'depart') && workFrom) {
      labor.push({ start: workFrom.t, end: e.t, ids: ids(workFrom, e) })
      workFrom = null
    }
    if (e.kind === 'pause') {
      if (travelFrom) travel.push({ start: travelFrom.t, end: e.t, ids: ids(travelFrom, e) })
      if (workFrom) labor.push({ start: workFrom.t, end: e.t, ids: ids(workFrom, e) })
      travelFrom = workFrom = null
    }
  }
  const end = until.getTime()
  if (travelFrom && end > travelFrom.t) travel.push({ start: travelFrom.t, end, ids: ids(travelFrom) })
  if (workFrom && end > workFrom.t) labor.push({ start: workFrom.t, end, ids: ids(workFrom) })
  return { travel, labor }
}

/** Total travel and labor time from the clock events (see clockSpans). */
export function clockTotals(events: BillingClockEvent[], now: Date = new Date()): { travelMs: number, laborMs: number } {
  const { travel, labor } = clockSpans(events, now)
  const sum = (s: Span[]) => s.reduce((n, x) => n + x.end - x.start, 0)
  return { travelMs: sum(travel), laborMs: sum(labor) }
}
