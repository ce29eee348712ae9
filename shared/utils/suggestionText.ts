// How dispatch reads a suggested mechanic: how far (in the business's distance unit), how long a
// drive, and how old the position is, since a position from yesterday says little about today.

/** International mile (1959 agreement), exact. */
const KM_PER_MI = 1.609344

export type DistanceUnit = 'km' | 'mi'

/** "12.4 mi", "35 km": one decimal under 100, whole above. */
export function distanceText(km: number, unit: DistanceUnit = 'km'): string {
  const v = unit === 'mi' ? km / KM_PER_MI : km
  return `${v < 100 ? v.toFixed(1) : Math.round(v)} ${unit}`
}

/** "position 8 min old", "position 3 h 5 min old", "position 2 d old", or "position unknown". */
export function positionAgeText(at: string | Date | null | undefined, now: number): string {
  if (at == null) return 'position unknown'
  const when = new Date(at).getTime()
  if (!Number.isFinite(when)) return 'position unknown'
  // A phone's clock a little ahead of the server's is "just now", not a negative age.
  const min = Math.max(0, Math.floor((now - when) / 60_000))
  if (min < 1) return 'position under a minute old'
  if (min < 60) return `position ${min} min old`
  const h = Math.floor(min / 60)
  if (h < 24) return `position ${h} h${min % 60 ? ` ${min % 60} min` : ''} old`
  return `position ${Math.floor(h / 24)} d old`
}

export type SuggestionDistance = { distanceKm: number | null, driveMinutes: number | null, positionAt: string | Date | null }

/** "1 h 5 min" for a drive time in whole minutes. */
const driveText = (min: number) => (min < 60 ? `${min} min` : `${Math.floor(min / 60)} h ${min % 60} min`)

/**
 * The line beside a suggested mechanic: "12.4 mi, about 20 min · position 8 min old"; with no
 * distance (no call position, or none from the mechanic) only the position's age.
 */
export function suggestionDistanceText(s: SuggestionDistance, now: number, unit: DistanceUnit = 'km'): string {
  const age = s.positionAt == null && s.distanceKm !== null ? 'position time unknown' : positionAgeText(s.positionAt, now)
  if (s.distanceKm === null) return age
  const drive = s.driveMinutes === null ? '' : `, about ${driveText(s.driveMinutes)}`
  return `${distanceText(s.distanceKm, unit)}${drive} · ${age}`
}
