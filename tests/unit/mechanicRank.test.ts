import { describe, expect, it } from 'vitest'
import { rankMechanics, type RankCandidate } from '../../shared/utils/mechanicRank'
import { haversineKm } from '../../shared/utils/geo'

const m = (id: string, onDuty: boolean, lat: number | null, lon: number | null, openCalls = 0): RankCandidate => ({
  id, name: id, onDuty, lastLat: lat, lastLon: lon, openCalls,
})

// The ranking rule is Wayside's own (DESIGN.md routes table): on duty, then distance, then load.
describe('rankMechanics', () => {
  const call = { lat: 45.0, lon: -93.0 }

  it('puts on-duty mechanics first, however close an off-duty one is', () => {
    // our own rule: on duty first
    const r = rankMechanics([m('off-near', false, 45.0, -93.0), m('on-far', true, 46, -93)], call, 70)
    expect(r.map(x => x.mechanic.id)).toEqual(['on-far', 'off-near'])
  })

  it('orders by haversine distance, then by open calls, then by name', () => {
    // our own rule; distances by the haversine formula (tests/unit/geo.test.ts checks it against Rosetta Code)
    const list = [m('b', true, 45.2, -93.0, 0), m('a', true, 45.1, -93.0, 3), m('c', true, 45.1, -93.0, 1), m('d', true, 45.1, -93.0, 1)]
    const r = rankMechanics(list, call, 70)
    expect(r.map(x => x.mechanic.id)).toEqual(['c', 'd', 'a', 'b'])
    expect(r[0]!.distanceKm).toBeCloseTo(haversineKm({ lat: 45.1, lon: -93 }, call), 9)
  })

  it('gives drive minutes at the average road speed, rounded up', () => {
    // arithmetic: 0.1° of latitude = 11.1195 km (R = 6371 km); at 60 km/h that is 11.12 min -> 12
    const [only] = rankMechanics([m('a', true, 45.1, -93.0)], call, 60)
    expect(only!.driveMinutes).toBe(12)
  })

  it('ranks mechanics with no known position after located ones, and ranks by load when the call has no position', () => {
    // our own rule: unknown distance sorts last; without a call position only duty and load count
    const list = [m('nowhere', true, null, null, 0), m('here', true, 45.05, -93.0, 2)]
    expect(rankMechanics(list, call, 70).map(x => x.mechanic.id)).toEqual(['here', 'nowhere'])
    const noPos = rankMechanics(list, null, 70)
    expect(noPos.map(x => x.mechanic.id)).toEqual(['nowhere', 'here'])
    expect(noPos.every(x => x.distanceKm === null && x.driveMinutes === null)).toBe(true)
  })
})
