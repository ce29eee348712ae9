import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { driveMinutes, haversineKm } from '../../shared/utils/geo'

const BNA = { lat: 36.12, lon: -86.67 }
const LAX = { lat: 33.94, lon: -118.4 }

describe('haversineKm', () => {
  it('Rosetta Code worked example BNA -> LAX', () => {
    // Rosetta Code haversine example, R = 6371.0 km: 2886.444442837983 km (REFERENCES.md §9, npm haversine agrees)
    expect(Math.abs(haversineKm(BNA, LAX) - 2886.444442837983)).toBeLessThan(1e-9)
  })

  it('is symmetric and zero for the same point', () => {
    // haversine formula: d(a,b) = d(b,a), d(a,a) = 0
    expect(Math.abs(haversineKm(LAX, BNA) - haversineKm(BNA, LAX))).toBeLessThan(1e-9)
    expect(haversineKm(BNA, BNA)).toBe(0)
  })

  it('a quarter meridian and half the equator', () => {
    // great circle on a sphere of R = 6371.0 km: pole to equator is πR/2, antipodes πR
    expect(Math.abs(haversineKm({ lat: 0, lon: 0 }, { lat: 90, lon: 0 }) - (Math.PI * 6371) / 2)).toBeLessThan(1e-6)
    expect(Math.abs(haversineKm({ lat: 0, lon: 0 }, { lat: 0, lon: 180 }) - Math.PI * 6371)).toBeLessThan(1e-6)
  })

  it('one degree of latitude is about 111.19 km', () => {
    // sphere R = 6371.0 km: 1° of arc = 2π·6371/360 = 111.195 km
    expect(Math.abs(haversineKm({ lat: 45, lon: -100 }, { lat: 46, lon: -100 }) - 111.19492664455873)).toBeLessThan(1e-6)
  })

  it('never exceeds half the circumference', () => {
    // great-circle distance on a sphere is at most πR
    const pt = fc.record({ lat: fc.double({ min: -90, max: 90, noNaN: true }), lon: fc.double({ min: -180, max: 180, noNaN: true }) })
    fc.assert(fc.property(pt, pt, (a, b) => {
      const d = haversineKm(a, b)
      return d >= 0 && d <= Math.PI * 6371 + 1e-6
    }))
  })

  it('rejects out-of-range and NaN coordinates', () => {
    // our own input contract: lat -90..90, lon -180..180
    expect(() => haversineKm({ lat: 91, lon: 0 }, LAX)).toThrow(RangeError)
    expect(() => haversineKm({ lat: -90.5, lon: 0 }, LAX)).toThrow(RangeError)
    expect(() => haversineKm(BNA, { lat: 0, lon: 181 })).toThrow(RangeError)
    expect(() => haversineKm(BNA, { lat: 0, lon: -180.1 })).toThrow(RangeError)
    expect(() => haversineKm({ lat: Number.NaN, lon: 0 }, LAX)).toThrow(RangeError)
    expect(() => haversineKm(BNA, { lat: 0, lon: Number.NaN })).toThrow(RangeError)
  })
})

describe('driveMinutes', () => {
  it('rounds up to whole minutes', () => {
    // arithmetic: 60 min/h × km / (km/h), rounded up (an ETA should not be early)
    expect(driveMinutes(10, 30)).toBe(20)
    expect(driveMinutes(10.1, 30)).toBe(21)
    expect(driveMinutes(100, 80)).toBe(75)
    expect(driveMinutes(0, 80)).toBe(0)
    expect(driveMinutes(0.01, 80)).toBe(1)
    // Rosetta Code BNA -> LAX 2886.44 km at 90 km/h = 1924.3 min -> 1925
    expect(driveMinutes(haversineKm(BNA, LAX), 90)).toBe(1925)
  })

  it('rejects NaN, negative distance and non-positive speed', () => {
    // our own input contract
    expect(() => driveMinutes(Number.NaN, 80)).toThrow(RangeError)
    expect(() => driveMinutes(-1, 80)).toThrow(RangeError)
    expect(() => driveMinutes(10, 0)).toThrow(RangeError)
    expect(() => driveMinutes(10, Number.NaN)).toThrow(RangeError)
    expect(() => driveMinutes(10, Infinity)).toThrow(RangeError)
  })
})
