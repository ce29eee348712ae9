import { describe, expect, it } from 'vitest'
import { distanceText, positionAgeText, suggestionDistanceText } from '../../shared/utils/suggestionText'

const NOW = Date.parse('2026-03-10T15:00:00Z')
const ago = (ms: number) => new Date(NOW - ms).toISOString()
const MIN = 60_000

describe('distanceText', () => {
  it('gives miles by the international mile', () => {
    // 1959 yard and pound agreement (REFERENCES §12): 1 mi = 1.609344 km, so 19.955 km = 12.4 mi
    expect(distanceText(19.9558656, 'mi')).toBe('12.4 mi')
    // 160.9344 km is exactly 100 mi: whole miles from 100 up
    expect(distanceText(160.9344, 'mi')).toBe('100 mi')
  })
  it('gives km as they are', () => {
    expect(distanceText(7.25, 'km')).toBe('7.3 km')
    expect(distanceText(123.6)).toBe('124 km')
  })
})

describe('positionAgeText', () => {
  it('says unknown when the phone never sent a position', () => {
    expect(positionAgeText(null, NOW)).toBe('position unknown')
    expect(positionAgeText('not a time', NOW)).toBe('position unknown')
  })
  it('counts whole minutes, then hours, then days', () => {
    // 1 min = 60 s (SI); 8 min 59 s is 8 whole minutes
    expect(positionAgeText(ago(8 * MIN + 59_000), NOW)).toBe('position 8 min old')
    expect(positionAgeText(ago(30_000), NOW)).toBe('position under a minute old')
    expect(positionAgeText(ago(125 * MIN), NOW)).toBe('position 2 h 5 min old')
    expect(positionAgeText(ago(180 * MIN), NOW)).toBe('position 3 h old')
    // 1 d = 24 h: 50 h is 2 whole days
    expect(positionAgeText(ago(50 * 60 * MIN), NOW)).toBe('position 2 d old')
  })
  it('reads a phone clock slightly ahead as just now, never a negative age', () => {
    expect(positionAgeText(new Date(NOW + 90_000), NOW)).toBe('position under a minute old')
  })
})

describe('suggestionDistanceText', () => {
  it('puts the age beside the distance and drive time', () => {
    const line = suggestionDistanceText({ distanceKm: 19.9558656, driveMinutes: 20, positionAt: ago(8 * MIN) }, NOW, 'mi')
    expect(line).toBe('12.4 mi, about 20 min · position 8 min old')
    expect(suggestionDistanceText({ distanceKm: 90, driveMinutes: 75, positionAt: ago(MIN) }, NOW, 'km'))
      .toBe('90.0 km, about 1 h 15 min · position 1 min old')
  })
  it('gives only the age when there is no distance', () => {
    expect(suggestionDistanceText({ distanceKm: null, driveMinutes: null, positionAt: null }, NOW)).toBe('position unknown')
    expect(suggestionDistanceText({ distanceKm: null, driveMinutes: null, positionAt: ago(3 * MIN) }, NOW)).toBe('position 3 min old')
  })
})
