// Great-circle distance for ranking mechanics by distance; good to well under 0.5 % on the
// scale of a road-call territory, which is all dispatch needs (road distance is longer anyway).

export interface GeoPoint {
  lat: number
  lon: number
}

// Mean Earth radius commonly used with haversine (and in the Rosetta Code worked example).
const EARTH_RADIUS_KM = 6371.0

function geoCheck(p: GeoPoint, name: string): void {
  if (!p || typeof p !== 'object') throw new RangeError(`${name} must be a {lat, lon} point`)
  if (typeof p.lat !== 'number' || !Number.isFinite(p.lat) || p.lat < -90 || p.lat > 90) {
    throw new RangeError(`${name} latitude must be a number from -90 to 90, got ${p.lat}`)
  }
  if (typeof p.lon !== 'number' || !Number.isFinite(p.lon) || p.lon < -180 || p.lon > 180) {
    throw new RangeError(`${name} longitude must be a number from -180 to 180, got ${p.lon}`)
  }
}

const toRad = (deg: number) => (deg * Math.PI) / 180

/** Great-circle distance in km between two points in decimal degrees. */
export function haversineKm(a: GeoPoint, b: GeoPoint): number {
  geoCheck(a, 'First point')
  geoCheck(b, 'Second point')
  const dLat = toRad(b.lat - a.lat)
  const dLon = toRad(b.lon - a.lon)
  const h = Math.sin(dLat / 2) ** 2 + Math.cos(toRad(a.lat)) * Math.cos(toRad(b.lat)) * Math.sin(dLon / 2) ** 2
  // min() guards asin against h creeping past 1 by rounding for antipodal points.
  return 2 * EARTH_RADIUS_KM * Math.asin(Math.min(1, Math.sqrt(h)))
}

/** Estimated drive time in whole minutes, rounded up (an ETA given to a driver should not be early). */
export function driveMinutes(km: number, avgKph: number): number {
  if (typeof km !== 'number' || !Number.isFinite(km) || km < 0) {
    throw new RangeError(`Distance must be a finite number of km, 0 or more, got ${km}`)
  }
  if (typeof avgKph !== 'number' || !Number.isFinite(avgKph) || avgKph <= 0) {
    throw new RangeError(`Average speed must be a positive finite number of km/h, got ${avgKph}`)
  }
  const minutes = (km * 60) / avgKph
  // Shave float noise so an exact 20 minutes does not become 21.
  return Math.max(0, Math.ceil(minutes - 1e-9))
}
