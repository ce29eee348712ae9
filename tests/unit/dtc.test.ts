import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  decodeJ1939Dtc,
  describeFaultCode,
  dtcToObdBytes,
  fmiText,
  j1939DtcToBytes,
  obdBytesToDtc,
  parseDtc,
  spnName,
} from '../../shared/utils/dtc'

describe('parseDtc (SAE J2012 structure)', () => {
  it('classifies the first character', () => {
    // SAE J2012: P powertrain, C chassis, B body, U network
    expect(parseDtc('P0118').system).toBe('powertrain')
    expect(parseDtc('C0123').system).toBe('chassis')
    expect(parseDtc('B1234').system).toBe('body')
    expect(parseDtc('U0100').system).toBe('network')
  })

  it('classifies SAE-defined vs manufacturer codes by the second character', () => {
    // SAE J2012: P0 and P2 SAE-defined, P1 manufacturer
    expect(parseDtc('P0118').generic).toBe(true)
    expect(parseDtc('P2ABC').generic).toBe(true)
    expect(parseDtc('P1234').generic).toBe(false)
    expect(parseDtc('P1234').group).toMatch(/manufacturer/i)
    // SAE J2012: B, C, U — 0 SAE-defined, 1 and 2 manufacturer
    expect(parseDtc('U0100').generic).toBe(true)
    expect(parseDtc('B1234').generic).toBe(false)
    expect(parseDtc('C2100').generic).toBe(false)
    expect(parseDtc('U0100').group).toMatch(/SAE/)
    // SAE J2012: second character 3 is reserved or split by edition
    expect(parseDtc('P3400').group).toMatch(/reserved/i)
    expect(parseDtc('U3000').generic).toBe(false)
  })

  it.each([
    ['P0100', /fuel and air/i, 'SAE J2012 P0 third char 0–2: fuel and air metering'],
    ['P0118', /fuel and air/i, 'SAE J2012 P0 third char 0–2: fuel and air metering'],
    ['P0201', /fuel and air/i, 'SAE J2012 P0 third char 0–2: fuel and air metering'],
    ['P0300', /ignition|misfire/i, 'SAE J2012 P0 third char 3: ignition or misfire'],
    ['P0420', /emission/i, 'SAE J2012 P0 third char 4: auxiliary emission controls'],
    ['P0500', /speed.*idle/i, 'SAE J2012 P0 third char 5: vehicle speed, idle and auxiliary inputs'],
    ['P0606', /computer/i, 'SAE J2012 P0 third char 6: computer and outputs'],
    ['P0700', /transmission/i, 'SAE J2012 P0 third char 7–9: transmission'],
    ['P0800', /transmission/i, 'SAE J2012 P0 third char 7–9: transmission'],
    ['P0900', /transmission/i, 'SAE J2012 P0 third char 7–9: transmission'],
    ['P0A7F', /hybrid/i, 'SAE J2012 P0 third char A: hybrid propulsion'],
  ])('%s group (%s)', (code, group) => {
    // SAE J2012 P0 group table (see row source)
    expect(parseDtc(code).group).toMatch(group)
  })

  it('normalizes case and surrounding spaces, accepts hex third to fifth characters', () => {
    // SAE J2012: third to fifth characters are hexadecimal (P0A7F exists)
    expect(parseDtc(' p0a7f ').code).toBe('P0A7F')
  })

  it.each(['', 'P011', 'P01188', 'X0118', 'P4118', 'P01G8', 'P-118', '0118P'])('throws on malformed %j', (bad) => {
    // SAE J2012 structure: letter PCBU, digit 0–3, three hex digits
    expect(() => parseDtc(bad)).toThrow(RangeError)
  })

  it('throws on non-text', () => {
    // our own input contract
    expect(() => parseDtc(118 as unknown as string)).toThrow(RangeError)
  })
})

describe('obdBytesToDtc (SAE J1979 service 03)', () => {
  it.each([
    [0x01, 0x33, 'P0133'],
    [0x03, 0x00, 'P0300'],
    [0x04, 0x20, 'P0420'],
    [0x41, 0x23, 'C0123'],
    [0x92, 0x34, 'B1234'],
    [0xc1, 0x00, 'U0100'],
    [0x0a, 0x7f, 'P0A7F'],
    [0x2a, 0xbc, 'P2ABC'],
  ])('%i %i -> %s', (high, low, code) => {
    // SAE J1979 service 03 byte layout, vectors from REFERENCES §4
    expect(obdBytesToDtc(high, low)).toBe(code)
    expect(dtcToObdBytes(code)).toEqual([high, low])
  })

  it('round-trips every byte pair', () => {
    // SAE J1979 service 03: the two bytes map one-to-one onto the five characters
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 255 }), fc.integer({ min: 0, max: 255 }), (h, l) => {
        const [h2, l2] = dtcToObdBytes(obdBytesToDtc(h, l))
        return h2 === h && l2 === l
      }),
    )
  })

  it('rejects non-bytes', () => {
    // SAE J1979: each DTC half is one byte, 0–255
    expect(() => obdBytesToDtc(256, 0)).toThrow(RangeError)
    expect(() => obdBytesToDtc(-1, 0)).toThrow(RangeError)
    expect(() => obdBytesToDtc(1.5, 0)).toThrow(RangeError)
    expect(() => obdBytesToDtc(Number.NaN, 0)).toThrow(RangeError)
    expect(() => obdBytesToDtc(0, Number.NaN)).toThrow(RangeError)
  })
})

describe('J1939 DM1 DTC (conversion method 4)', () => {
  it.each([
    [[0x64, 0x00, 0x01, 0x01], 100, 1, 1],
    [[0x9a, 0x0c, 0x04, 0x02], 3226, 4, 2],
    [[0x00, 0xf0, 0xff, 0x7e], 520192, 31, 126],
    [[0xff, 0xff, 0xe0, 0x01], 524287, 0, 1],
  ] as [[number, number, number, number], number, number, number][])('%j -> SPN %i FMI %i OC %i', (bytes, spn, fmi, oc) => {
    // SAE J1939-73 DM1 byte layout, vectors from REFERENCES §4
    expect(decodeJ1939Dtc(bytes)).toEqual({ spn, fmi, oc, cm: 0 })
    expect(j1939DtcToBytes(spn, fmi, oc)).toEqual(bytes)
  })

  it('reports the conversion-method bit', () => {
    // SAE J1939-73 DM1: CM in bit 8 of the fourth byte
    expect(decodeJ1939Dtc([0x64, 0x00, 0x01, 0x81])).toEqual({ spn: 100, fmi: 1, oc: 1, cm: 1 })
  })

  it('round-trips every field combination', () => {
    // SAE J1939-73 DM1: 19-bit SPN, 5-bit FMI, 1-bit CM, 7-bit OC fill the 4 bytes exactly
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 524287 }),
        fc.integer({ min: 0, max: 31 }),
        fc.integer({ min: 0, max: 127 }),
        fc.constantFrom(0 as const, 1 as const),
        (spn, fmi, oc, cm) => {
          const d = decodeJ1939Dtc(j1939DtcToBytes(spn, fmi, oc, cm))
          return d.spn === spn && d.fmi === fmi && d.oc === oc && d.cm === cm
        },
      ),
    )
  })

  it('rejects bytes out of 0..255, non-integers, NaN and wrong length', () => {
    // SAE J1939-73 DM1: 4 bytes per DTC; SPN 19 bits, FMI 5 bits, OC 7 bits
    expect(() => decodeJ1939Dtc([256, 0, 0, 0])).toThrow(RangeError)
    expect(() => decodeJ1939Dtc([0, -1, 0, 0])).toThrow(RangeError)
    expect(() => decodeJ1939Dtc([0, 0, 1.5, 0])).toThrow(RangeError)
    expect(() => decodeJ1939Dtc([0, 0, 0, Number.NaN])).toThrow(RangeError)
    expect(() => decodeJ1939Dtc([0, 0, 0] as unknown as [number, number, number, number])).toThrow(RangeError)
    expect(() => j1939DtcToBytes(524288, 0)).toThrow(RangeError)
    expect(() => j1939DtcToBytes(100, 32)).toThrow(RangeError)
    expect(() => j1939DtcToBytes(100, 1, 128)).toThrow(RangeError)
    expect(() => j1939DtcToBytes(Number.NaN, 1)).toThrow(RangeError)
  })
})

describe('fmiText', () => {
  it.each([
    [0, /above normal.*most severe/i],
    [1, /below normal.*most severe/i],
    [2, /erratic|incorrect/i],
    [3, /voltage above normal|shorted.*high/i],
    [4, /voltage below normal|shorted.*low/i],
    [5, /current below normal|open circuit/i],
    [6, /current above normal|grounded/i],
    [7, /mechanical.*not responding/i],
    [8, /frequency|pulse width/i],
    [9, /update rate/i],
    [10, /rate of change/i],
    [11, /root cause not known/i],
    [12, /bad.*device|component/i],
    [13, /calibration/i],
    [14, /special instructions/i],
    [15, /above normal.*least severe/i],
    [16, /above normal.*moderate/i],
    [17, /below normal.*least severe/i],
    [18, /below normal.*moderate/i],
    [19, /network data in error/i],
    [20, /drifted high/i],
    [21, /drifted low/i],
    [31, /condition exists/i],
  ])('FMI %i', (fmi, re) => {
    // SAE J1939-73 FMI table as reprinted in component manuals (REFERENCES §4)
    expect(fmiText(fmi)).toMatch(re)
  })

  it.each([22, 23, 24, 25, 26, 27, 28, 29, 30])('FMI %i is reserved', (fmi) => {
    // SAE J1939-73: 22–30 carry no meaning in the reprinted table
    expect(fmiText(fmi)).toMatch(/reserved/i)
  })

  it('rejects numbers outside 0..31', () => {
    // SAE J1939-73: FMI is 5 bits, 0–31
    expect(() => fmiText(32)).toThrow(RangeError)
    expect(() => fmiText(-1)).toThrow(RangeError)
    expect(() => fmiText(2.5)).toThrow(RangeError)
    expect(() => fmiText(Number.NaN)).toThrow(RangeError)
  })
})

describe('spnName and describeFaultCode', () => {
  it('names the SPNs in the reference table', () => {
    // SAE J1939-71 names (REFERENCES §4): 110 engine coolant temperature, 175 engine oil temperature, 190 engine speed
    expect(spnName(110)).toMatch(/coolant temperature/i)
    expect(spnName(175)).toMatch(/oil temperature/i)
    expect(spnName(190)).toMatch(/engine speed/i)
    expect(spnName(520192)).toBeUndefined()
    expect(() => spnName(-1)).toThrow(RangeError)
  })

  it('describes a J2012 code', () => {
    // SAE J2012: P0118 is powertrain, SAE-defined, fuel and air metering group
    expect(describeFaultCode({ code: 'p0118' })).toEqual({
      label: 'P0118',
      system: 'powertrain',
      generic: true,
      group: 'Fuel and air metering',
    })
  })

  it('describes a J1939 SPN/FMI', () => {
    // SAE J1939-71 SPN 110 name, J1939-73 FMI 0 meaning (REFERENCES §4)
    const d = describeFaultCode({ spn: 110, fmi: 0 })
    expect(d.label).toBe('SPN 110 FMI 0')
    expect(d.spnName).toMatch(/coolant/i)
    expect(d.fmiText).toMatch(/above normal/i)
    expect(describeFaultCode({ spn: 520192, fmi: 31 }).spnName).toBeUndefined()
  })

  it('rejects missing, mixed or malformed input', () => {
    // our own input contract; 'PO118' has a letter O where J2012 needs a digit
    expect(() => describeFaultCode({})).toThrow(RangeError)
    expect(() => describeFaultCode({ spn: 110 })).toThrow(RangeError)
    expect(() => describeFaultCode({ code: 'P0118', spn: 110, fmi: 0 })).toThrow(RangeError)
    expect(() => describeFaultCode({ code: 'PO118' })).toThrow(RangeError)
    expect(() => describeFaultCode({ spn: 110, fmi: Number.NaN })).toThrow(RangeError)
  })
})

describe('parseDtc errors name what is wrong', () => {
  it.each([
    ['P011', /4 characters; a J2012 code has 5/],
    ['X0118', /starts with "X": the first character must be P, C, B or U/],
    ['P4118', /second character must be a digit 0–3, not "4"/],
    ['PO118', /not "O" \(the letter O\? type the digit 0\)/],
    ['P01G8', /character 4 \("G"\) must be a digit 0–9 or a letter A–F/],
    ['', /No fault code given/],
  ])('%j', (bad, msg) => {
    // SAE J2012 structure: letter PCBU, digit 0–3, three hex digits
    expect(() => parseDtc(bad)).toThrow(msg)
  })
})
