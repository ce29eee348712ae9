// The map link for each phone platform, with user agents as the browsers send them.
import { describe, expect, it } from 'vitest'
import { mapLinks, mapPlatform } from '../../app/utils/mapLink'

// User-agent strings in the published formats of Safari on iOS 17, Chrome on Android 14 and
// desktop Chrome on Linux (from memory of their documented shapes).
const IPHONE = 'Mozilla/5.0 (iPhone; CPU iPhone OS 17_4 like Mac OS X) AppleWebKit/605.1.15 (KHTML, like Gecko) '
  + 'Version/17.4 Mobile/15E148 Safari/604.1'
const IPAD_DESKTOP = 'Mozilla/5.0 (Macintosh; Intel Mac OS X 10_15_7) AppleWebKit/605.1.15 (KHTML, like Gecko) Version/17.4 Safari/605.1.15'
const ANDROID = 'Mozilla/5.0 (Linux; Android 14; K) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/124.0.0.0 Mobile Safari/537.36'
const DESKTOP = 'Mozilla/5.0 (X11; Linux x86_64) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/124.0.0.0 Safari/537.36'

describe('mapPlatform', () => {
  it('tells iOS, iPadOS asking for desktop pages, Android and the rest apart', () => {
    expect(mapPlatform(IPHONE)).toBe('ios')
    // iPadOS 13+ sends a Mac user agent by default; only the touch points tell it from a Mac (from memory)
    expect(mapPlatform(IPAD_DESKTOP, 5)).toBe('ios')
    expect(mapPlatform(IPAD_DESKTOP, 0)).toBe('other')
    expect(mapPlatform(ANDROID)).toBe('android')
    expect(mapPlatform(DESKTOP)).toBe('other')
  })
})

describe('mapLinks', () => {
  const point = { lat: 45.335, lon: -93.351 }

  it('Android: a geo: URI with the point as a query and its label', () => {
    // RFC 5870: geo:<lat>,<lon>; Android's map intents take ?q=<lat>,<lon>(<label>) to drop a labelled pin (from memory)
    expect(mapLinks(point, 'Call #5', 'android').app).toBe('geo:45.335000,-93.351000?q=45.335000,-93.351000(Call%20%235)')
  })

  it('iOS: an https link to the maps site, which the phone opens in its map app', () => {
    // Apple's Map Links reference: ll=<lat>,<lon> centres the map, q= labels the pin (from memory)
    expect(mapLinks(point, 'Call #5', 'ios').app).toBe('https://maps.apple.com/?ll=45.335000,-93.351000&q=Call%20%235')
  })

  it('anything else, and always as a fallback: a web map and the coordinates', () => {
    // openstreetmap.org permalinks: mlat/mlon place the marker, #map=zoom/lat/lon frames it
    const other = mapLinks(point, '', 'other')
    expect(other.app).toBe(other.web)
    expect(other.web).toBe('https://www.openstreetmap.org/?mlat=45.335000&mlon=-93.351000#map=17/45.335000/-93.351000')
    expect(mapLinks(point, 'x', 'android').web).toBe(other.web)
    expect(other.coordinates).toBe('45.335000, -93.351000')
    expect(() => mapLinks({ lat: 95, lon: 0 }, 'x', 'ios')).toThrow(RangeError)
    expect(() => mapLinks({ lat: Number.NaN, lon: 0 }, 'x', 'ios')).toThrow(RangeError)
  })
})
