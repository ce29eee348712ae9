// Dates of the real world (a report's range, a payment, an export): Wayside's records start in
// 2000 and nothing is planned more than five years ahead, so a date outside is a typing slip or
// a probe, answered 400 naming the field rather than run as a query over a century.
import { z } from 'zod'

export const EARLIEST_DAY = '2000-01-01'
export const YEARS_AHEAD = 5

/** The last day accepted: today plus five years (UTC). */
export function latestDay(now = new Date()): string {
  const d = new Date(now)
  d.setUTCFullYear(d.getUTCFullYear() + YEARS_AHEAD)
  return d.toISOString().slice(0, 10)
}

function realDay(s: string) {
  const t = Date.parse(`${s}T00:00:00Z`)
  return !Number.isNaN(t) && new Date(t).toISOString().slice(0, 10) === s
}

/** An ISO day `YYYY-MM-DD` between 2000-01-01 and five years from today. */
export function isoDay(label: string) {
  return z.string({ message: `${label} must be a date like 2026-03-31` })
    .regex(/^\d{4}-\d{2}-\d{2}$/, `${label}: use a date like 2026-03-31`)
    .refine(realDay, `${label} is not a real date`)
    .refine(s => !realDay(s) || s >= EARLIEST_DAY, `${label} is before ${EARLIEST_DAY}`)
    .refine(s => !realDay(s) || s <= latestDay(), `${label} is more than ${YEARS_AHEAD} years ahead`)
}

const dayOf = (s: string) => {
  const t = Date.parse(s)
  return Number.isNaN(t) ? '' : new Date(t).toISOString().slice(0, 10)
}

/** An ISO 8601 time with its zone (`2026-03-31T14:05:00Z`) in the same span. */
export function isoTime(label: string) {
  return z.string({ message: `${label} must be a time like 2026-03-31T14:05:00Z` })
    .max(40, `${label} is not a time`)
    .refine(s => /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d{1,6})?)?(Z|[+-]\d{2}:\d{2})$/.test(s) && !Number.isNaN(Date.parse(s)),
      `${label} must be a time like 2026-03-31T14:05:00Z`)
    .refine(s => !dayOf(s) || dayOf(s) >= EARLIEST_DAY, `${label} is before ${EARLIEST_DAY}`)
    .refine(s => !dayOf(s) || dayOf(s) <= latestDay(), `${label} is more than ${YEARS_AHEAD} years ahead`)
}
