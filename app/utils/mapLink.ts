// A link that opens the call's position in the phone's own map app. Android hands a geo: URI
// (RFC 5870) to whichever map app is installed; iOS opens no geo: URI, but opens its map app from
// an https link to its maps site. Any other browser gets a web map, and every screen also offers
// the web map and the coordinates themselves in case the app link does nothing.

export type MapPlatform = 'ios' | 'android' | 'other'

/** Which kind of phone, from the user agent; an iPad asking for desktop pages calls itself a Mac with touch. */
export function mapPlatform(userAgent: string, maxTouchPoints = 0): MapPlatform {
  if (/\b(iPhone|iPad|iPod)\b/.test(userAgent)) return 'ios'
  if (/\bMacintosh\b/.test(userAgent) && maxTouchPoints > 1) return 'ios'
  if (/\bAndroid\b/.test(userAgent)) return 'android'
  return 'other'
}

export interface MapLinks {
  /** Opens the phone's map app where it can, else the web map. */
  app: string
  /** A web map that opens in any browser. */
  web: string
  /** '45.335000, -93.351000' for reading out or pasting. */
  coordinates: string
}

const fixed = (n: number) => n.toFixed(6)

export function mapLinks(point: { lat: number, lon: number }, label: string, platform: MapPlatform): MapLinks {
  const { lat, lon } = point
  if (!Number.isFinite(lat) || !Number.isFinite(lon) || Math.abs(lat) > 90 || Math.abs(lon) > 180) {
    throw new RangeError(`Not a position: ${lat}, ${lon}`)
  }
  const ll = `${fixed(lat)},${fixed(lon)}`
  const name = encodeURIComponent(label.trim() || 'Call')
  const web = `https://www.openstreetmap.org/?mlat=${fixed(lat)}&mlon=${fixed(lon)}#map=17/${fixed(lat)}/${fixed(lon)}`
  const app = platform === 'android'
    ? `geo:${ll}?q=${ll}(${name})`
    : platform === 'ios'
      ? `https://maps.apple.com/?ll=${ll}&q=${name}`
      : web
  return { app, web, coordinates: `${fixed(lat)}, ${fixed(lon)}` }
}
