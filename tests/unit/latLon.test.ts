import { describe, expect, it } from 'vitest'
import { parseLatLon } from '../../shared/utils/latLon'

// Decimal degrees with the usual sign convention (south and west negative) — common practice.
describe('parseLatLon', () => {
  it.each([
    ['45.288, -93.102', 45.288, -93.102],
    ['45.288,-93.102', 45.288, -93.102],
    [' 45.288   -93.102 ', 45.288, -93.102],
    ['45.288; -93.102', 45.288, -93.102],
    ['45.288 N, 93.102 W', 45.288, -93.102],
    ['45.288° N 93.102° W', 45.288, -93.102],
    ['N 45.288, W 93.102', 45.288, -93.102],
    ['93.102 W, 45.288 N', 45.288, -93.102],
    ['-33.9, 151.2', -33.9, 151.2],
    ['12, 8', 12, 8],
  ])('reads %j', (text, lat, lon) => {
    // common practice: "lat, lon" in decimal degrees; S and W are negative
    expect(parseLatLon(text)).toEqual({ lat, lon })
  })

  it.each(['', '45.288', 'Route 8 mile 42', '45.288, -93.102, 7', 'abc, def'])('refuses %j', (text) => {
    // our own contract: only a pair of numbers is a position
    expect(parseLatLon(text)).toBeNull()
  })
})
