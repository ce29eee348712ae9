import { describe, expect, it } from 'vitest'
import { arrivalWords, roughArrival, roundArrivalMinutes } from '../../shared/utils/roughArrival'

// One degree of latitude on a sphere of R = 6371.0 km is 2π·6371/360 = 111.195 km (REFERENCES.md, haversine).
const A = { lat: 45, lon: -100 }
const B = { lat: 46, lon: -100 }

describe('roughArrival', () => {
  it('one degree of latitude at 60 km/h, straight line: 111.2 min → 120 (rounded up to 10 within two hours)', () => {
    // 111.195 km / 60 km/h = 111.2 min; ceil → 112; step 10 (common practice for spoken ETAs) → 120
    expect(roughArrival(A, B, { averageKph: 60, roadFactorPct: 100, positionAgeMin: 2 })).toEqual({ minutes: 120, words: 'about 2 hours' })
  })

  it('the road factor lengthens the straight line before the speed is applied', () => {
    // 111.195 km × 1.3 = 144.55 km at 80 km/h = 108.4 min → 109 → 110
    expect(roughArrival(A, B, { averageKph: 80, roadFactorPct: 130, positionAgeMin: 0 })?.minutes).toBe(110)
  })

  it('says nothing from an old position, or with either position missing', () => {
    const opts = { averageKph: 60, roadFactorPct: 100 }
    expect(roughArrival(A, B, { ...opts, positionAgeMin: 31 })).toBeNull()
    expect(roughArrival(A, B, { ...opts, positionAgeMin: null })).toBeNull()
    expect(roughArrival(null, B, { ...opts, positionAgeMin: 1 })).toBeNull()
    expect(roughArrival(A, null, { ...opts, positionAgeMin: 1 })).toBeNull()
  })
})

describe('roundArrivalMinutes and arrivalWords', () => {
  it('rounds up to 5, 10 or 15 minutes and never answers 0', () => {
    // common practice: nobody is told "0 minutes"; steps grow with the guess
    expect([0, 1, 5, 6, 30, 31, 119, 121, 136].map(roundArrivalMinutes)).toEqual([5, 5, 5, 10, 30, 40, 120, 135, 150])
  })
  it('reads as people say it', () => {
    expect(arrivalWords(5)).toBe('within about 5 minutes')
    expect(arrivalWords(25)).toBe('about 25 minutes')
    expect(arrivalWords(60)).toBe('about 1 hour')
    expect(arrivalWords(70)).toBe('about 1 hour 10 minutes')
    expect(arrivalWords(135)).toBe('about 2 hours 15 minutes')
  })
})
