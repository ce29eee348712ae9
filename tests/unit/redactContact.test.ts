import { describe, expect, it } from 'vitest'
import { REDACTED, redactContact } from '../../shared/utils/redactContact'

describe('redactContact', () => {
  it('removes e-mail addresses (RFC 5322 addr-spec, the common dot-atom form)', () => {
    expect(redactContact('Sent pics to j.doe+fleet@ironwood-freight.test, ok')).toBe(`Sent pics to ${REDACTED}, ok`)
  })
  it('removes phone numbers as NANP writes them: 7 digits, with area code, brackets, dots or country code', () => {
    // ITU-T E.123 / NANP presentation forms
    for (const n of ['555-0141', '612-555-0141', '(612) 555-0141', '612.555.0141', '+1 612 555 0141']) {
      expect(redactContact(`driver at ${n} called`)).toBe(`driver at ${REDACTED} called`)
    }
  })
  it('keeps part numbers, dates, readings and codes', () => {
    const text = 'Part 4954905 on 2026-12-02; 1.2 kΩ at 84 °C; SPN 3516 FMI 18; odometer 412 345 km; P0118'
    expect(redactContact(text)).toBe(text)
  })
  it('passes null through', () => {
    expect(redactContact(null)).toBeNull()
  })
})
