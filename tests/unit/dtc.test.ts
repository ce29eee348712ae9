import { describe, expect, it } from 'vitest'
import {
  decodeJ1939Dtc,
  describeFaultCode,
  dtcToObdBytes,
  dtcMeaning,
  fmiKind,
  fmiText,
  j1939DtcToBytes,
  KNOWN_DTCS,
  KNOWN_SPNS,
  obdBytesToDtc,
  parseDm1,
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

// Byte examples from outside the project: python-OBD's decoder tests (tests/test_decoders.py) for the
// SAE J1979 service 03 pair, and the Equipment & Tool Institute's open J1939-84 tool's unit tests
// (DiagnosticTroubleCodeTest, DM1ActiveDTCsPacketTest) for J1939-73 DM1. See REFERENCES.md.

describe('obdBytesToDtc (SAE J1979 service 03)', () => {
  it.each([
    [0x01, 0x04, 'P0104'],
    [0x41, 0x23, 'C0123'],
    [0x80, 0x03, 'B0003'],
  ])('%i %i -> %s', (high, low, code) => {
    // python-OBD tests/test_decoders.py (test_dtc, test_single_dtc): 0104 -> P0104, 4123 -> C0123, 8003 -> B0003
    expect(obdBytesToDtc(high, low)).toBe(code)
    expect(dtcToObdBytes(code)).toEqual([high, low])
  })

  it('reads the letter, the digit 0–3 and three hex characters from the two bytes', () => {
    // SAE J1979 service 03 (REFERENCES.md, "Two OBD bytes"): byte A bits 7–6 letter P C B U, bits 5–4 second character,
    // bits 3–0 third; byte B the fourth and fifth. U (11) with second digit 0: C1 00 is U0100 by that table.
    expect(obdBytesToDtc(0xc1, 0x00)).toBe('U0100')
    expect(obdBytesToDtc(0x2a, 0xbc)).toBe('P2ABC')
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
  type Row = [[number, number, number, number], number, number, number, 0 | 1]
  it.each([
    [[0x61, 0x02, 0x13, 0x81], 609, 19, 1, 1],
    [[0x21, 0x06, 0x1f, 0x23], 1569, 31, 35, 0],
    [[0xee, 0x10, 0x04, 0x00], 4334, 4, 0, 0],
    [[0x00, 0x00, 0x1f, 0x00], 0, 31, 0, 0],
    [[0x00, 0x00, 0x00, 0x80], 0, 0, 0, 1],
    [[0x00, 0x00, 0x00, 0x7f], 0, 0, 127, 0],
    [[0xff, 0xff, 0xe0, 0x00], 524287, 0, 0, 0],
  ] as Row[])('%j -> SPN %i FMI %i OC %i CM %i', (bytes, spn, fmi, oc, cm) => {
    // ETI J1939-84 tool, DiagnosticTroubleCodeTest: each 4-byte DTC with the SPN, FMI, occurrence count and CM it asserts
    expect(decodeJ1939Dtc(bytes)).toEqual({ spn, fmi, oc, cm })
    expect(j1939DtcToBytes(spn, fmi, oc, cm)).toEqual(bytes)
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

describe('parseDm1 (SAE J1939-73 DM1 data)', () => {
  // ETI J1939-84 tool, DM1ActiveDTCsPacketTest: "18FECA00 11 CD 61 02 13 00 21 06 1F 00 EE 10 04 00" is
  // MIL off, red stop lamp slow flash, amber off, protect fast flash; DTCs 609:19, 1569:31, 4334:4, 0 times.
  const ETI_DM1 = [0x11, 0xcd, 0x61, 0x02, 0x13, 0x00, 0x21, 0x06, 0x1f, 0x00, 0xee, 0x10, 0x04, 0x00]

  it('reads the ETI example: lamps, then three codes', () => {
    // ETI DM1ActiveDTCsPacketTest (see above); a flashing lamp is lit, so red stop and protect are on
    expect(parseDm1(ETI_DM1)).toEqual({
      lamps: { mil: false, redStop: true, amberWarning: false, protect: true },
      dtcs: [
        { spn: 609, fmi: 19, oc: 0, cm: 0 },
        { spn: 1569, fmi: 31, oc: 0, cm: 0 },
        { spn: 4334, fmi: 4, oc: 0, cm: 0 },
      ],
    })
  })

  it.each([
    [0x40, 'mil'],
    [0x10, 'redStop'],
    [0x04, 'amberWarning'],
    [0x01, 'protect'],
  ] as const)('lamp byte %i lights %s alone', (byte, lamp) => {
    // ETI J1939-84 DiagnosticTroubleCodePacket: lamp byte = MIL << 6 | red stop << 4 | amber << 2 | protect; 01 is on
    const { lamps } = parseDm1([byte, 0xff, 0x00, 0x00, 0x00, 0x00, 0xff, 0xff])
    expect(lamps).toEqual({ mil: false, redStop: false, amberWarning: false, protect: false, [lamp]: true })
  })

  it('leaves a lamp dark for 00 off, 10 error and 11 not available', () => {
    // SAE J1939-73 lamp status: 00 off, 01 on, 10 and 11 not a lit lamp (from memory); 0xFF is every lamp "not available"
    expect(parseDm1([0xff, 0xff]).lamps).toEqual({ mil: false, redStop: false, amberWarning: false, protect: false })
    expect(parseDm1([0x80 | 0x20 | 0x08 | 0x02, 0xff]).lamps).toEqual({ mil: false, redStop: false, amberWarning: false, protect: false })
  })

  it('drops the no-fault entry and the 0xFF filler of an 8-byte frame', () => {
    // ETI J1939-84 DiagnosticTroubleCodePacket.create: no codes is 00 00 00 00 after the lamps, padded with FF FF to 8 bytes
    expect(parseDm1([0x00, 0xff, 0x00, 0x00, 0x00, 0x00, 0xff, 0xff]).dtcs).toEqual([])
    // the same padding after one code (ETI DiagnosticTroubleCodeTest test3 bytes)
    expect(parseDm1([0x04, 0xff, 0xee, 0x10, 0x04, 0x00, 0xff, 0xff]).dtcs).toEqual([{ spn: 4334, fmi: 4, oc: 0, cm: 0 }])
    // a whole 4-byte group of FF is filler too
    expect(parseDm1([0x04, 0xff, 0xee, 0x10, 0x04, 0x00, 0xff, 0xff, 0xff, 0xff]).dtcs).toHaveLength(1)
  })

  it('reads occurrence count 127 as not available and keeps the conversion-method bit', () => {
    // SAE J1939-73: OC 127 means not available (from memory); ETI DiagnosticTroubleCodeTest: 7F -> 127, 80 -> CM 1
    expect(parseDm1([0x00, 0xff, 0x64, 0x00, 0x01, 0x7f]).dtcs).toEqual([{ spn: 100, fmi: 1, oc: null, cm: 0 }])
    expect(parseDm1([0x00, 0xff, 0x61, 0x02, 0x13, 0x81]).dtcs).toEqual([{ spn: 609, fmi: 19, oc: 1, cm: 1 }])
  })

  it('refuses a code cut short, naming where it starts', () => {
    // SAE J1939-73: every code is 4 bytes; three of them are not a code
    expect(() => parseDm1([0x11, 0xcd, 0x61, 0x02, 0x13])).toThrow(/byte 3 is cut short: 3 of its 4 bytes/)
    expect(() => parseDm1(ETI_DM1.slice(0, -1))).toThrow(/byte 11 is cut short/)
  })

  it('refuses bytes outside 0–255, NaN, too few bytes and non-lists', () => {
    // SAE J1939-73 DM1: a list of bytes with at least the lamp byte and the flash byte
    expect(() => parseDm1([0x11, 0xcd, 256, 0, 0, 0])).toThrow(/byte 3 must be an integer byte 0–255/)
    expect(() => parseDm1([0x11, Number.NaN])).toThrow(RangeError)
    expect(() => parseDm1([0x11, 0xcd, -1, 0, 0, 0])).toThrow(RangeError)
    expect(() => parseDm1([0x11])).toThrow(/lamp byte and the flash byte/)
    expect(() => parseDm1('11 CD' as unknown as number[])).toThrow(RangeError)
  })
})

describe('fmiText', () => {
  // ETI J1939-84 tool, resources/fmis.csv (the J1939-73 FMI titles it prints), checked word for word where it matters
  it.each([
    [0, /data valid but above normal.*most severe/i],
    [1, /data valid but below normal.*most severe/i],
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
    [15, /data valid but above normal.*least severe/i],
    [16, /data valid but above normal.*moderate/i],
    [17, /data valid but below normal.*least severe/i],
    [18, /data valid but below normal.*moderate/i],
    [19, /network data in error/i],
    [20, /drifted high/i],
    [21, /drifted low/i],
    [31, /condition exists/i],
  ])('FMI %i', (fmi, re) => {
    // ETI fmis.csv row for this FMI (see above)
    expect(fmiText(fmi)).toMatch(re)
  })

  it.each([22, 23, 24, 25, 26, 27, 28, 29, 30])('FMI %i is reserved', (fmi) => {
    // ETI fmis.csv: 22–30 "Reserved For SAE Assignment"
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

describe('fmiKind', () => {
  // The kind follows each FMI's J1939-73 title (ETI fmis.csv): "data valid" and "condition exists" are real
  // conditions; voltage/current above or below normal are the circuit; erratic, frequency, rate of change and
  // drift are the signal; update rate and network data the network; bad device and calibration the device.
  const KINDS: [number, string][] = [
    [0, 'condition'], [1, 'condition'], [2, 'signal'], [3, 'circuit'], [4, 'circuit'], [5, 'circuit'], [6, 'circuit'],
    [7, 'mechanical'], [8, 'signal'], [9, 'network'], [10, 'signal'], [11, 'other'], [12, 'device'], [13, 'device'],
    [14, 'other'], [15, 'condition'], [16, 'condition'], [17, 'condition'], [18, 'condition'], [19, 'network'],
    [20, 'signal'], [21, 'signal'], [22, 'other'], [23, 'other'], [24, 'other'], [25, 'other'], [26, 'other'],
    [27, 'other'], [28, 'other'], [29, 'other'], [30, 'other'], [31, 'condition'],
  ]

  it('covers all 32 FMIs', () => {
    // SAE J1939-73: FMI is 5 bits, 0–31
    expect(KINDS.map(([fmi]) => fmi)).toEqual(Array.from({ length: 32 }, (_, i) => i))
  })

  it.each(KINDS)('FMI %i is %s', (fmi, kind) => {
    // ETI fmis.csv title for this FMI, grouped as described above
    expect(fmiKind(fmi)).toBe(kind)
  })

  it('every data-valid FMI is a condition', () => {
    // ETI fmis.csv: the titles that begin "Data Valid" are 0, 1 and 15–18
    for (const fmi of [0, 1, 15, 16, 17, 18]) {
      expect(fmiText(fmi)).toMatch(/^data valid/i)
      expect(fmiKind(fmi)).toBe('condition')
    }
  })

  it('rejects numbers outside 0..31', () => {
    // SAE J1939-73: FMI is 5 bits, 0–31
    for (const bad of [32, -1, 2.5, Number.NaN, Infinity]) expect(() => fmiKind(bad)).toThrow(RangeError)
    expect(() => fmiKind('4' as unknown as number)).toThrow(RangeError)
  })
})

describe('spnName', () => {
  // ETI J1939-84 tool, resources/spns.csv (names from the J1939 digital annex): the words each of our names must keep
  it.each([
    [46, /air supply pressure/i, 'Pneumatic Supply Pressure'],
    [84, /vehicle speed/i, 'Wheel-Based Vehicle Speed'],
    [91, /accelerator pedal position 1/i, 'Accelerator Pedal Position 1'],
    [100, /engine oil pressure/i, 'Engine Oil Pressure'],
    [102, /intake manifold 1/i, 'Engine Intake Manifold #1 Pressure'],
    [105, /intake manifold 1 temperature/i, 'Engine Intake Manifold 1 Temperature'],
    [108, /barometric pressure/i, 'Barometric Pressure'],
    [110, /engine coolant temperature/i, 'Engine Coolant Temperature'],
    [111, /engine coolant level/i, 'Engine Coolant Level 1'],
    [114, /battery 1 net current/i, 'SLI Battery 1 Net Current'],
    [115, /alternator current/i, 'Alternator Current'],
    [116, /brake application/i, 'Brake Application Pressure'],
    [117, /brake primary/i, 'Brake Primary Pressure'],
    [118, /brake secondary/i, 'Brake Secondary Pressure'],
    [158, /key switch/i, 'Key Switch Battery Potential'],
    [167, /charging system voltage/i, 'Charging System Potential (Voltage)'],
    [168, /battery voltage.*power input 1/i, 'Battery Potential / Power Input 1'],
    [171, /ambient air temperature/i, 'Ambient Air Temperature'],
    [173, /engine exhaust temperature/i, 'Engine Exhaust Temperature'],
    [175, /engine oil temperature/i, 'Engine Oil Temperature 1'],
    [190, /engine speed/i, 'Engine Speed'],
    [1569, /torque derate/i, 'Engine Protection Torque Derate'],
    [1761, /DEF tank/, 'Aftertreatment 1 Diesel Exhaust Fluid Tank Volume'],
    [3216, /NOx ahead of the SCR.*intake/, 'Aftertreatment 1 SCR Intake NOx 1'],
    [3226, /NOx after the SCR.*outlet/, 'Aftertreatment 1 Outlet NOx 1'],
    [3241, /exhaust temperature 1.*after-treatment 1/i, 'Aftertreatment 1 Exhaust Temperature 1'],
    [3242, /DPF inlet temperature/, 'Aftertreatment 1 Diesel Particulate Filter Intake Temperature'],
    [3246, /DPF outlet temperature/, 'Aftertreatment 1 Diesel Particulate Filter Outlet Temperature'],
    [3251, /DPF differential pressure/, 'Aftertreatment 1 Diesel Particulate Filter Differential Pressure'],
    [3364, /DEF quality/, 'Aftertreatment 1 Diesel Exhaust Fluid Tank Quality'],
    [3509, /sensor supply 1/i, 'Sensor supply voltage 1'],
    [3510, /sensor supply 2/i, 'Sensor supply voltage 2'],
    [3511, /sensor supply 3/i, 'Sensor supply voltage 3'],
    [3516, /DEF concentration/, 'Aftertreatment 1 Diesel Exhaust Fluid Concentration'],
    [3719, /DPF soot load/, 'Aftertreatment 1 Diesel Particulate Filter Soot Load Percent'],
    [4334, /DEF doser pressure/, 'Aftertreatment 1 Diesel Exhaust Fluid Doser 1 Absolute Pressure'],
    [4765, /DOC inlet temperature/, 'Aftertreatment 1 Diesel Oxidation Catalyst Intake Temperature'],
    [4766, /DOC outlet temperature/, 'Aftertreatment 1 Diesel Oxidation Catalyst Outlet Temperature'],
  ] as [number, RegExp, string][])('SPN %i', (spn, re) => {
    // ETI spns.csv name for this SPN (third column of the row)
    expect(spnName(spn)).toMatch(re)
  })

  it('knows nothing of SPNs outside its table and refuses what is not an SPN', () => {
    // SAE J1939-73: the SPN is 19 bits, 0–524287
    expect(spnName(520192)).toBeUndefined()
    expect(() => spnName(-1)).toThrow(RangeError)
    expect(() => spnName(524288)).toThrow(RangeError)
    expect(() => spnName(Number.NaN)).toThrow(RangeError)
  })

  it('offers the same table as the pick list', () => {
    // the pick list and spnName read one table
    for (const { spn, name } of KNOWN_SPNS) expect(spnName(spn)).toBe(name)
    expect(KNOWN_SPNS.map(s => s.spn)).toEqual(expect.arrayContaining([110, 168, 3242, 3251, 3516]))
  })
})

describe('dtcMeaning', () => {
  // python-OBD obd/codes.py (J2012 titles) for P0xxx; the OBDIICodes list (fabiovila/OBDIICodes 24.h) for P2xxx.
  it.each([
    ['P0115', /coolant temperature sensor circuit$/i, 'Engine Coolant Temperature Circuit'],
    ['P0116', /coolant temperature.*out of range or implausible/i, 'Engine Coolant Temperature Circuit Range/Performance'],
    ['P0117', /coolant temperature sensor circuit low/i, 'Engine Coolant Temperature Circuit Low'],
    ['P0118', /coolant temperature sensor circuit high/i, 'Engine Coolant Temperature Circuit High'],
    ['P0217', /coolant over-temperature/i, 'Engine Coolant Over Temperature Condition'],
    ['P0544', /exhaust temperature sensor circuit \(bank 1, sensor 1\)/i, 'Exhaust Gas Temperature Sensor Circuit'],
    ['P0545', /exhaust temperature sensor circuit low \(bank 1, sensor 1\)/i, 'Exhaust Gas Temperature Sensor Circuit Low'],
    ['P0546', /exhaust temperature sensor circuit high \(bank 1, sensor 1\)/i, 'Exhaust Gas Temperature Sensor Circuit High'],
    ['P0549', /exhaust temperature sensor circuit high \(bank 2/i, 'Exhaust Gas Temperature Sensor Circuit High'],
    ['P0560', /^system voltage$/i, 'System Voltage'],
    ['P0562', /system voltage low/i, 'System Voltage Low'],
    ['P0563', /system voltage high/i, 'System Voltage High'],
    ['P0620', /alternator control circuit/i, 'Generator Control Circuit'],
    ['P0641', /sensor supply A circuit, or open/i, 'Sensor Reference Voltage \'A\' Circuit/Open'],
    ['P0651', /sensor supply B circuit, or open/i, 'Sensor Reference Voltage \'B\' Circuit/Open'],
    ['P0697', /sensor supply C circuit, or open/i, 'Sensor Reference Voltage \'C\' Circuit/Open'],
    ['P2031', /exhaust temperature sensor circuit \(bank 1, sensor 2\)/i, 'Exhaust Gas Temperature Sensor Circuit Bank 1 Sensor 2'],
    ['P2032', /circuit low \(bank 1, sensor 2\)/i, 'Exhaust Gas Temperature Sensor Circuit Low Bank 1 Sensor 2'],
    ['P2033', /circuit high \(bank 1, sensor 2\)/i, 'Exhaust Gas Temperature Sensor Circuit High Bank 1 Sensor 2'],
    ['P2080', /exhaust temperature.*out of range.*bank 1, sensor 1/i, 'Exhaust Gas Temperature Sensor Circuit Range/Performance Bank 1 Sensor 1'],
    ['P2084', /exhaust temperature.*out of range.*bank 1, sensor 2/i, 'Exhaust Gas Temperature Sensor Circuit Range/Performance Bank 1 Sensor 2'],
    ['P20EC', /SCR catalyst over-temperature/, 'SCR NOx Catalyst - Over Temperature Bank 1'],
    ['P20EE', /SCR catalyst NOx conversion below threshold/, 'SCR NOx Catalyst Efficiency Below Threshold Bank 1'],
  ])('%s', (code, re) => {
    // title in the list named above for this code (third column)
    expect(dtcMeaning(code)).toMatch(re)
  })

  it('says what P0545 is, not which group it sits in', () => {
    // python-OBD obd/codes.py: P0545 "Exhaust Gas Temperature Sensor Circuit Low"; J2012 puts P05xx in the
    // "vehicle speed, idle control and auxiliary inputs" group, which says nothing of an exhaust sensor
    const d = describeFaultCode({ code: 'p0545' })
    expect(d.meaning).toMatch(/exhaust temperature sensor circuit low/i)
    expect(d.group).toMatch(/speed.*idle/i)
  })

  it('answers undefined for a code outside its table and refuses a malformed one', () => {
    // SAE J2012 structure; P0300 is a real code our short table does not carry
    expect(dtcMeaning('P0300')).toBeUndefined()
    expect(() => dtcMeaning('PO545')).toThrow(/the letter O/)
    for (const { code } of KNOWN_DTCS) expect(() => parseDtc(code)).not.toThrow()
  })
})

describe('describeFaultCode', () => {
  it('describes a J2012 code', () => {
    // SAE J2012: P0118 is powertrain, SAE-defined, fuel and air metering group; python-OBD: "Engine Coolant Temperature Circuit High"
    expect(describeFaultCode({ code: 'p0118' })).toEqual({
      label: 'P0118',
      system: 'powertrain',
      generic: true,
      group: 'Fuel and air metering',
      meaning: 'Coolant temperature sensor circuit high',
    })
    expect(describeFaultCode({ code: 'P0300' })).not.toHaveProperty('meaning')
  })

  it('describes a J1939 SPN/FMI', () => {
    // ETI spns.csv SPN 110 "Engine Coolant Temperature"; ETI fmis.csv FMI 0 "Data Valid But Above Normal Operational Range"
    const d = describeFaultCode({ spn: 110, fmi: 0 })
    expect(d.label).toBe('SPN 110 FMI 0')
    expect(d.spnName).toMatch(/coolant/i)
    expect(d.fmiText).toMatch(/data valid but above normal/i)
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
