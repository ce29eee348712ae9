// Travel and labor time from the call's clock events; never typed. Travel runs from
// travel_start to arrive, labor from work_start to work_stop; an open span counts up to `now`.

export interface ClockMark { kind: string; at: string }

function spans(marks: readonly ClockMark[], open: string, close: string[], now: number): number {
  let total = 0
  let from: number | null = null
  for (const m of [...marks].sort((a, b) => a.at.localeCompare(b.at))) {
    const t = Date.parse(m.at)
    if (Number.isNaN(t)) continue
    if (m.kind === open && from === null) from = t
    else if (close.includes(m.kind) && from !== null) { total += Math.max(0, t - from); from = null }
  }
  if (from !== null) total += Math.max(0, now - from)
  return total
}

export function fieldClockTotals(marks: readonly ClockMark[], now = Date.now()) {
  const sorted = [...marks].sort((a, b) => a.at.localeCompare(b.at))
  const lastWork = [...sorted].reverse().find(m => m.kind === 'work_start' || m.kind === 'work_stop' || m.kind === 'depart')
  const lastTravel = [...sorted].reverse().find(m => m.kind === 'travel_start' || m.kind === 'arrive')
  return {
    travelMs: spans(sorted, 'travel_start', ['arrive'], now),
    laborMs: spans(sorted, 'work_start', ['work_stop', 'depart'], now),
    working: lastWork?.kind === 'work_start',
    travelling: lastTravel?.kind === 'travel_start',
  }
}

/** 1 h 05 min, 12 min, 0 min. */
export function formatSpan(ms: number): string {
  const min = Math.floor(ms / 60_000)
  const h = Math.floor(min / 60)
  return h ? `${h} h ${String(min % 60).padStart(2, '0')} min` : `${min} min`
}
