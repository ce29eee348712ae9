// Positions come to the dispatcher as text: read off a map app, a fleet tracker or a message,
// usually "45.288, -93.102" but sometimes with hemisphere letters ("45.288 N 93.102 W").

const NUM = String.raw`([+-]?\d{1,3}(?:\.\d+)?)\s*°?\s*([NSEW])?`
const PAIR = new RegExp(String.raw`^\s*([NSEW])?\s*${NUM}\s*[,;\s]\s*([NSEW])?\s*${NUM}\s*$`, 'i')

function signed(value: string, before?: string, after?: string): number {
  const n = Number(value)
  const h = (after ?? before ?? '').toUpperCase()
  return h === 'S' || h === 'W' ? -Math.abs(n) : n
}

/** "lat, lon" text as numbers, or null when the text is not a pair of coordinates. Ranges are not checked here. */
export function parseLatLon(text: string): { lat: number, lon: number } | null {
  if (typeof text !== 'string') return null
  const m = PAIR.exec(text)
  if (!m) return null
  const [, h1, a, h1b, h2, b, h2b] = m
  // Hemisphere letters can also say which number is which ("93.1 W, 45.2 N").
  const firstIsLon = /[EW]/i.test(h1b ?? h1 ?? '') && /[NS]/i.test(h2b ?? h2 ?? '')
  const first = signed(a!, h1, h1b)
  const second = signed(b!, h2, h2b)
  return firstIsLon ? { lat: second, lon: first } : { lat: first, lon: second }
}
