import { describe, expect, it } from 'vitest'
import { BATTERY_OCV_TABLE_80F, batteryStateOfCharge } from '../../shared/utils/battery'

// A battery maker's open-circuit table for a 12 V flooded lead-acid battery at rest, 80 °F (REFERENCES.md §7):
// 12.65 V 100 %, 12.45 V 75 %, 12.24 V 50 %, 12.06 V 25 %, 11.89 V discharged.
const MAKER_80F: readonly (readonly [number, number])[] = [[12.65, 100], [12.45, 75], [12.24, 50], [12.06, 25], [11.89, 0]]

describe('batteryStateOfCharge', () => {
  it.each(MAKER_80F)('%d V at rest is %d %%', (volts, pct) => {
    // battery maker's 80 °F table, the row for this voltage
    expect(batteryStateOfCharge(volts)).toBeCloseTo(pct, 9)
  })

  it('carries the maker\'s rows', () => {
    // battery maker's 80 °F table
    expect([...BATTERY_OCV_TABLE_80F].reverse()).toEqual(MAKER_80F)
  })

  it('is linear between rows', () => {
    // battery maker's 80 °F table: halfway between 12.24 V (50 %) and 12.45 V (75 %) is 62.5 %
    expect(batteryStateOfCharge(12.345)).toBeCloseTo(62.5, 9)
    // a quarter of the way from 11.89 V (0 %) to 12.06 V (25 %)
    expect(batteryStateOfCharge(11.89 + 0.17 / 4)).toBeCloseTo(6.25, 9)
  })

  it('clamps to 0–100 outside the table', () => {
    // battery maker's 80 °F table stops at 11.89 V (discharged) and 12.65 V (full); a surface-charged 12.9 V is full, 10.5 V empty
    expect(batteryStateOfCharge(12.9)).toBe(100)
    expect(batteryStateOfCharge(10.5)).toBe(0)
    expect(batteryStateOfCharge(0)).toBe(0)
  })

  it('reads a 24 V system as two 12 V batteries in series', () => {
    // battery maker's 80 °F table, doubled for two batteries in series: 24.90 V is 12.45 V each, 75 %
    expect(batteryStateOfCharge(24.9, 24)).toBeCloseTo(75, 9)
    expect(batteryStateOfCharge(25.3, 24)).toBeCloseTo(100, 9)
    expect(batteryStateOfCharge(23.78, 24)).toBeCloseTo(0, 9)
  })

  it('refuses NaN, negative and infinite volts and a system that is not 12 or 24 V', () => {
    // our own input contract
    expect(() => batteryStateOfCharge(Number.NaN)).toThrow(/finite/)
    expect(() => batteryStateOfCharge(Infinity)).toThrow(/finite/)
    expect(() => batteryStateOfCharge(-12.6)).toThrow(/negative/)
    expect(() => batteryStateOfCharge(12.6, 48 as 24)).toThrow(/12 or 24/)
  })
})
