// Who to send: mechanics on duty first, then the nearest by great-circle distance from their last
// known position, then the fewest open calls. A mechanic with no known position ranks after
// those with one, since "unknown" may be far away.
import { driveMinutes, haversineKm, type GeoPoint } from './geo'

export interface RankCandidate {
  id: string
  name: string
  onDuty: boolean
  lastLat: number | null
  lastLon: number | null
  openCalls: number
}
export interface RankedCandidate<T extends RankCandidate> { mechanic: T, distanceKm: number | null, driveMinutes: number | null }

export function rankMechanics<T extends RankCandidate>(
  mechanics: readonly T[],
  callAt: GeoPoint | null,
  averageRoadKph: number,
): RankedCandidate<T>[] {
  const ranked = mechanics.map((m) => {
    const known = callAt && m.lastLat !== null && m.lastLon !== null
    const distanceKm = known ? haversineKm({ lat: m.lastLat!, lon: m.lastLon! }, callAt) : null
    return { mechanic: m, distanceKm, driveMinutes: distanceKm === null ? null : driveMinutes(distanceKm, averageRoadKph) }
  })
  return ranked.sort((a, b) => {
    if (a.mechanic.onDuty !== b.mechanic.onDuty) return a.mechanic.onDuty ? -1 : 1
    if (a.distanceKm !== b.distanceKm) {
      if (a.distanceKm === null) return 1
      if (b.distanceKm === null) return -1
      return a.distanceKm - b.distanceKm
    }
    if (a.mechanic.openCalls !== b.mechanic.openCalls) return a.mechanic.openCalls - b.mechanic.openCalls
    return a.mechanic.name.localeCompare(b.mechanic.name)
  })
}
