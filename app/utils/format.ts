// Display helpers for the office screens.

/** "4 min", "1 h 12 min", "2 d 3 h": how long something has been going on, at a glance. */
export function formatDuration(ms: number): string {
  const min = Math.max(0, Math.floor(ms / 60_000))
  if (min < 60) return `${min} min`
  const h = Math.floor(min / 60)
  if (h < 48) return `${h} h ${min % 60} min`
  return `${Math.floor(h / 24)} d ${h % 24} h`
}

/** Time since `at` (Date or ISO text), against `now`. */
export function since(at: string | Date | null | undefined, now: number): string {
  if (!at) return '—'
  return formatDuration(now - new Date(at).getTime())
}

export function formatDateTime(at: string | Date | null | undefined): string {
  if (!at) return '—'
  return new Date(at).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' })
}

/** Text typed as money ("1,500.50", "$200") -> cents; '' -> null; NaN when unreadable. */
export function centsFromText(text: string): number | null {
  const t = text.replace(/[$,\s]/g, '')
  if (t === '') return null
  if (!/^-?\d+(\.\d{0,2})?$/.test(t)) return Number.NaN
  return Math.round(Number(t) * 100)
}

/** Text from a number box -> number; '' -> null; NaN when unreadable. */
export function numberFromText(text: string | number | null | undefined): number | null {
  if (text === null || text === undefined) return null
  if (typeof text === 'number') return text
  const t = text.trim().replace(',', '.')
  if (t === '') return null
  return /^[+-]?\d+(\.\d+)?$/.test(t) ? Number(t) : Number.NaN
}

export function formatMinutes(min: number): string {
  return formatDuration(min * 60_000)
}

export function formatKm(km: number | null | undefined): string {
  if (km === null || km === undefined) return '—'
  return km < 10 ? `${km.toFixed(1)} km` : `${Math.round(km)} km`
}
