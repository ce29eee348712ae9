// A rough arrival time for the fleet's status page: never the mechanic's position, only minutes,
// rounded up to a step that does not pretend to more precision than a straight-line guess has.
import { driveMinutes, haversineKm, type GeoPoint } from './geo'

/** A position older than this says nothing about where the mechanic is now. */
export const ARRIVAL_POSITION_MAX_AGE_MIN = 30

export interface RoughArrival {
  /** Minutes from now, rounded up to the step. */
  minutes: number
  words: string
}

/** Rounds up: to 5 minutes within the half hour, 10 within two hours, 15 beyond (common practice for spoken ETAs). */
export function roundArrivalMinutes(minutes: number): number {
  const step = minutes <= 30 ? 5 : minutes <= 120 ? 10 : 15
  return Math.max(step, Math.ceil(minutes / step) * step)
}

/** "about 25 minutes", "about 1 hour 10 minutes". */
export function arrivalWords(minutes: number): string {
  if (minutes <= 5) return 'within about 5 minutes'
  const h = Math.floor(minutes / 60)
  const m = minutes % 60
  const hours = h ? `${h} hour${h > 1 ? 's' : ''}` : ''
  const mins = m ? `${m} minutes` : ''
  return `about ${[hours, mins].filter(Boolean).join(' ')}`
}

/**
 * Road distance guessed from the straight line × the road factor (a percentage, 100 or more), at the
 * average road speed; null when either position is missing or the mechanic's is too old.
 */
export type ArrivalOptions = { averageKph: number, roadFactorPct: number, positionAgeMin: number | null }
export function roughArrival(from: GeoPoint | null, to: GeoPoint | null, opts: ArrivalOptions): RoughArrival | null {
  if (!from || !to || opts.positionAgeMin == null || opts.positionAgeMin > ARRIVAL_POSITION_MAX_AGE_MIN) return null
  const km = haversineKm(from, to) * Math.max(100, opts.roadFactorPct) / 100
  const minutes = roundArrivalMinutes(driveMinutes(km, opts.averageKph))
  return { minutes, words: arrivalWords(minutes) }
}
