// Readings as people write them. Conventions from the SI Brochure (BIPM, 9th ed. 2019, 5.4.3–5.4.4)
// and NIST SP 811 (2008, 7.2): a space between the number and the unit symbol, °C and % included;
// digits grouped in threes with a space, never a comma. Section numbers from memory.
import { describe, expect, it } from 'vitest'
import { OL_OHMS } from '../../shared/utils/cardRun'
import { rtdResistance } from '../../shared/utils/rtd'
import {
  OPEN_CIRCUIT_TEXT, UNIT_SPACE, formatConditions, formatNumber, formatQuantity, formatRange, formatReading, formatSpec, formatUnit,
} from '../../shared/utils/readingFormat'

// Compare with plain spaces; the formatter uses a no-break space so "209.4 Ω" never splits across lines.
const plain = (s: string | undefined) => s?.replaceAll(UNIT_SPACE, ' ')

describe('formatQuantity', () => {
  it('a space between the number and the unit symbol, °C and % included', () => {
    // NIST SP 811 7.2: "t = 30.2 °C, not 30.2°C"; SI Brochure 5.4.3: a space before every unit symbol, % too
    expect(plain(formatQuantity(30.2, 'degC'))).toBe('30.2 °C')
    expect(plain(formatQuantity(32.5, 'pct'))).toBe('32.5 %')
    expect(plain(formatQuantity(12.65, 'V'))).toBe('12.65 V')
    expect(formatQuantity(12.65, 'V')).toBe(`12.65${UNIT_SPACE}V`)
  })

  it('a Pt200 at 12 °C reads 209.4 Ω, not 209.363288', () => {
    // IEC 60751 (Callendar–Van Dusen, REFERENCES §1) scaled to R0 = 200 Ω: 209.363288 Ω at 12 °C;
    // common practice: a handheld meter shows four figures
    const ohms = rtdResistance(12, 200)
    expect(ohms).toBeCloseTo(209.363288, 6)
    expect(plain(formatQuantity(ohms, 'ohm'))).toBe('209.4 Ω')
  })

  it('resistance is ranged like a meter: Ω, kΩ, MΩ', () => {
    // REFERENCES §2: a 10 kΩ NTC (B 3950 K) reads 10 475 Ω at 23.96 °C; a meter shows 10.48 kΩ (common practice)
    expect(plain(formatQuantity(10_475, 'ohm'))).toBe('10.48 kΩ')
    expect(plain(formatQuantity(10.475, 'kohm'))).toBe('10.48 kΩ')
    expect(plain(formatQuantity(0.2, 'kohm'))).toBe('200 Ω')
    // REFERENCES §2, Murata NCP15WB473 by Beta: 463 773.791 Ω at −18 °C
    expect(plain(formatQuantity(463_773.791, 'ohm'))).toBe('463.8 kΩ')
    expect(plain(formatQuantity(2_200_000, 'ohm'))).toBe('2.2 MΩ')
  })

  it('an open circuit is OL (open), however it was stored', () => {
    // a meter shows OL on an open circuit; Wayside stores it as OL_OHMS because JSON has no Infinity
    expect(formatQuantity(Infinity, 'ohm')).toBe('OL (open)')
    expect(formatQuantity(OL_OHMS, 'ohm')).toBe(OPEN_CIRCUIT_TEXT)
    expect(formatQuantity(OL_OHMS / 1000, 'kohm')).toBe(OPEN_CIRCUIT_TEXT)
  })

  it('negative temperatures keep their sign; no float noise; a unit Wayside does not know passes through', () => {
    // J1939 one-byte temperature floor, −40 °C (REFERENCES §4 context)
    expect(plain(formatQuantity(-40, 'degC'))).toBe('-40 °C')
    expect(plain(formatQuantity(0.1 + 0.2, 'V'))).toBe('0.3 V')
    expect(plain(formatQuantity(-0.00001, 'V'))).toBe('-0.00001 V')
    expect(plain(formatQuantity(3, 'bar'))).toBe('3 bar')
    expect(() => formatQuantity(Number.NaN, 'V')).toThrow(RangeError)
  })
})

describe('formatNumber', () => {
  it('groups digits in threes with a space, never a comma, from 10 000 up', () => {
    // SI Brochure 5.4.4: "neither dots nor commas are inserted in the spaces between groups";
    // a four-digit number is left whole
    expect(plain(formatNumber(10_475))).toBe('10 475')
    expect(plain(formatNumber(1_234_567))).toBe('1 234 567')
    expect(formatNumber(4095)).toBe('4095')
    expect(formatNumber(-0)).toBe('0')
  })
})

describe('formatRange and formatSpec', () => {
  it('a range with an en dash and the unit once', () => {
    // the product owner's form: "205.2–213.6 Ω" (en dash U+2013, no spaces)
    expect(plain(formatRange(205.2, 213.6, 'ohm'))).toBe('205.2–213.6 Ω')
    expect(formatRange(4.8, 5.2, 'V')).toContain('\u2013')
    // a dash beside a minus sign misreads: words instead
    expect(plain(formatRange(-40, -20, 'degC'))).toBe('-40 to -20 °C')
    expect(plain(formatRange(12.4, undefined, 'V'))).toBe('≥ 12.4 V')
    expect(plain(formatRange(null, 0.5, 'V'))).toBe('≤ 0.5 V')
    expect(() => formatRange(undefined, undefined, 'V')).toThrow(RangeError)
  })

  it('a Pt200 at 12 °C ± 2 %: nominal and the limits it is judged against', () => {
    // IEC 60751 scaled to 200 Ω: 209.363288 Ω; ± 2 % gives 205.176–213.551 Ω (arithmetic on the standard's value),
    // the owner's example "205.2–213.6 Ω"
    const spec = { nominal: rtdResistance(12, 200), tolerancePct: 2 }
    expect(plain(formatSpec(spec, 'ohm'))).toBe('209.4 Ω ± 2 % (205.2–213.6 Ω)')
  })

  it('an absolute tolerance carries its unit on both numbers', () => {
    // NIST SP 811 7.7 (from memory): "63.2 m ± 0.1 m", not "63.2 ± 0.1 m"; REFERENCES §7: 5 V reference, 4.8–5.2 V accepted
    expect(plain(formatSpec({ nominal: 5, tolerance: 0.2 }, 'V'))).toBe('5 V ± 0.2 V (4.8–5.2 V)')
    expect(plain(formatSpec({ min: 4.8, max: 5.2 }, 'V'))).toBe('4.8–5.2 V')
    // REFERENCES §7, charging 13.5–14.5 V under load
    expect(plain(formatSpec({ min: 13.5, max: 14.5, text: 'within 13.5–14.5 V' }, 'V'))).toBe('13.5–14.5 V')
    // a 10 kΩ NTC ± 5 %: ranged together
    expect(plain(formatSpec({ nominal: 10_000, tolerancePct: 5 }, 'ohm'))).toBe('10 kΩ ± 5 % (9.5–10.5 kΩ)')
    expect(plain(formatSpec({ nominal: 10_000, tolerance: 500 }, 'ohm'))).toBe('10 kΩ ± 0.5 kΩ (9.5–10.5 kΩ)')
    expect(formatSpec({}, 'V')).toBeUndefined()
    expect(formatSpec(null, 'V')).toBeUndefined()
  })
})

describe('formatConditions and formatUnit', () => {
  it('conditions in words', () => {
    // how a mechanic says it: "key on, engine off" (common practice)
    expect(formatConditions('key_on_engine_off')).toBe('key on, engine off')
    expect(formatConditions('key_off')).toBe('key off')
    expect(formatConditions('running')).toBe('engine running')
    expect(formatConditions('idle_after_regen')).toBe('idle after regen')
    expect(formatConditions('at idle, 700 rpm')).toBe('at idle, 700 rpm')
    expect(formatConditions(null)).toBe('')
  })

  it('unit symbols, not the stored names', () => {
    // SI Brochure 5.4.3 (from memory for the section): symbols °C, Ω, %
    expect(formatUnit('degC')).toBe('°C')
    expect(formatUnit('degF')).toBe('°F')
    expect(formatUnit('ohm')).toBe('Ω')
    expect(formatUnit('pct')).toBe('%')
    expect(formatUnit(undefined)).toBe('')
  })
})

describe('formatReading', () => {
  it('every piece of a reading from a card run, formatted', () => {
    // IEC 60751 Pt200 at 12 °C (REFERENCES §1) as the card runner stores it
    const parts = formatReading({
      label: 'Sensor resistance at ambient', value: 118, unit: 'ohm', component: 'Exhaust temperature sensor 1', pins: 'A–B',
      conditions: 'key_off', spec: { nominal: 209.363288, tolerancePct: 2, text: '209.4 Ω ± 2 %' }, verdict: 'low',
    })
    expect(plain(parts.value)).toBe('118 Ω')
    expect(parts.where).toBe('Exhaust temperature sensor 1, pins A–B')
    expect(parts.conditions).toBe('key off')
    expect(plain(parts.spec)).toBe('209.4 Ω ± 2 % (205.2–213.6 Ω)')
    // words that only repeat the numbers are not shown twice
    expect(parts.specNote).toBeUndefined()
    expect(parts.verdict).toBe('Low')
  })

  it('keeps the words a spec was saved with when they explain it, and never throws on a bad record', () => {
    // common practice: like sensors judged against their median
    const spec = { min: -4.5, max: 26.5, text: 'within 15.5 °C of the median of 4 like sensors' }
    const like = formatReading({ value: -40, unit: 'degC', conditions: 'key_on_engine_off', spec, verdict: 'low' })
    expect(plain(like.spec)).toBe('-4.5 to 26.5 °C')
    expect(like.specNote).toBe('within 15.5 °C of the median of 4 like sensors')
    expect(like.conditions).toBe('key on, engine off')
    const bad = formatReading({ value: Number.NaN, unit: 'V', spec: { min: 5, max: 1 } })
    expect(bad.value).toBe('NaN V')
  })
})
