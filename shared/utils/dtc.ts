// Fault codes: SAE J2012 five-character codes, the two-byte form OBD service 03 reports them in,
// and J1939-73 DM1 SPN/FMI. Heavy trucks report J1939; light/medium units and many gauges show J2012.

export type DtcSystem = 'powertrain' | 'chassis' | 'body' | 'network'

export interface ParsedDtc {
  code: string
  system: DtcSystem
  generic: boolean
  group: string
}

export interface J1939Dtc {
  spn: number
  fmi: number
  oc: number
  cm: 0 | 1
}

const DTC_LETTERS = ['P', 'C', 'B', 'U'] as const
const DTC_SYSTEMS: Record<(typeof DTC_LETTERS)[number], DtcSystem> = {
  P: 'powertrain',
  C: 'chassis',
  B: 'body',
  U: 'network',
}

// P0 groups by third character (J2012). B–F are SAE-assigned too but not in our reference table,
// so they get a neutral label instead of a guess.
const P0_GROUPS: Record<string, string> = {
  0: 'Fuel and air metering',
  1: 'Fuel and air metering',
  2: 'Fuel and air metering',
  3: 'Ignition system or misfire',
  4: 'Auxiliary emission controls',
  5: 'Vehicle speed, idle control and auxiliary inputs',
  6: 'Computer and output circuits',
  7: 'Transmission',
  8: 'Transmission',
  9: 'Transmission',
  A: 'Hybrid propulsion',
}

const DTC_PATTERN = /^([PCBU])([0-3])([0-9A-F])([0-9A-F]{2})$/

// Names the first thing wrong with a code that is not J2012, so the mechanic can fix that one character.
function dtcProblem(code: string, norm: string): string {
  const ex = '(e.g. P0118)'
  const oh = (ch: string) => (ch === 'O' ? ' (the letter O? type the digit 0)' : ch === 'I' ? ' (the letter I? type the digit 1)' : '')
  if (!norm) return `No fault code given: a J2012 code is a letter P, C, B or U and four more characters ${ex}`
  if (norm.length !== 5) return `"${code}" has ${norm.length} characters; a J2012 code has 5 ${ex}`
  const [a, b] = [norm[0]!, norm[1]!]
  if (!'PCBU'.includes(a)) return `"${code}" starts with "${a}": the first character must be P, C, B or U${oh(a)}`
  if (!'0123'.includes(b)) return `"${code}": the second character must be a digit 0–3, not "${b}"${oh(b)}`
  for (let i = 2; i < 5; i++) {
    const ch = norm[i]!
    if (!/[0-9A-F]/.test(ch)) return `"${code}": character ${i + 1} ("${ch}") must be a digit 0–9 or a letter A–F${oh(ch)}`
  }
  return `"${code}" is not a J2012 fault code ${ex}`
}

/** Parse and classify a J2012 code such as 'p0118' (case and surrounding spaces forgiven). */
export function parseDtc(code: string): ParsedDtc {
  if (typeof code !== 'string') throw new RangeError('Fault code must be text like P0118')
  const norm = code.trim().toUpperCase()
  const m = DTC_PATTERN.exec(norm)
  if (!m) throw new RangeError(dtcProblem(code, norm))
  const letter = m[1] as (typeof DTC_LETTERS)[number]
  const second = m[2] ?? ''
  const third = m[3] ?? ''
  const system = DTC_SYSTEMS[letter]
  let generic: boolean
  let group: string
  if (second === '3') {
    // J2012 editions have split the x3xxx block differently; don't claim either reading.
    generic = false
    group = 'Reserved or manufacturer-specific (depends on J2012 edition)'
  }
  else if (letter === 'P') {
    generic = second !== '1'
    if (!generic) group = 'Manufacturer-specific'
    else if (second === '0') group = P0_GROUPS[third] ?? 'SAE-defined (group not in our table)'
    else group = 'SAE-defined'
  }
  else {
    generic = second === '0'
    group = generic ? 'SAE-defined' : 'Manufacturer-specific'
  }
  return { code: norm, system, generic, group }
}

function dtcCheckByte(name: string, v: number): void {
  if (typeof v !== 'number' || !Number.isInteger(v) || v < 0 || v > 255) {
    throw new RangeError(`${name} must be an integer byte 0–255, got ${v}`)
  }
}

const hex = (v: number, width: number) => v.toString(16).toUpperCase().padStart(width, '0')

/**
 * Two bytes of an OBD service 03 answer -> 'P0118'. Note 00 00 decodes to 'P0000', which in a
 * service 03 answer is padding, not a fault: the caller drops it.
 */
export function obdBytesToDtc(high: number, low: number): string {
  dtcCheckByte('OBD DTC high byte', high)
  dtcCheckByte('OBD DTC low byte', low)
  const letter = DTC_LETTERS[high >> 6] ?? 'P'
  return `${letter}${(high >> 4) & 0x3}${hex(high & 0xf, 1)}${hex(low, 2)}`
}

/** Inverse of obdBytesToDtc, so test vectors and fakes can be written as codes. */
export function dtcToObdBytes(code: string): [number, number] {
  const { code: norm } = parseDtc(code)
  const letterIndex = DTC_LETTERS.indexOf(norm[0] as (typeof DTC_LETTERS)[number])
  const high = (letterIndex << 6) | (Number(norm[1]) << 4) | parseInt(norm.slice(2, 3), 16)
  return [high, parseInt(norm.slice(3), 16)]
}

/**
 * One 4-byte DTC from a J1939 DM1 message (conversion method 4, the current one).
 * cm = 1 means the sender used an older SPN byte order (methods 1–3); the SPN we report is then
 * suspect and the caller should show it as such.
 */
export function decodeJ1939Dtc(bytes: [number, number, number, number]): J1939Dtc {
  if (!Array.isArray(bytes) || bytes.length !== 4) throw new RangeError('A J1939 DTC is exactly 4 bytes')
  const [b0, b1, b2, b3] = bytes
  dtcCheckByte('J1939 DTC byte 1', b0)
  dtcCheckByte('J1939 DTC byte 2', b1)
  dtcCheckByte('J1939 DTC byte 3', b2)
  dtcCheckByte('J1939 DTC byte 4', b3)
  return {
    spn: b0 | (b1 << 8) | ((b2 >> 5) << 16),
    fmi: b2 & 0x1f,
    oc: b3 & 0x7f,
    cm: ((b3 >> 7) & 1) as 0 | 1,
  }
}

/** Encode SPN/FMI/OC/CM into the 4 DM1 bytes (conversion method 4); the inverse of decodeJ1939Dtc. */
export function j1939DtcToBytes(spn: number, fmi: number, oc = 0, cm: 0 | 1 = 0): [number, number, number, number] {
  j1939CheckSpn(spn)
  j1939CheckFmi(fmi)
  if (!Number.isInteger(oc) || oc < 0 || oc > 127) throw new RangeError(`J1939 occurrence count must be an integer 0–127, got ${oc}`)
  if (cm !== 0 && cm !== 1) throw new RangeError(`J1939 conversion-method bit must be 0 or 1, got ${cm}`)
  return [spn & 0xff, (spn >> 8) & 0xff, ((spn >> 16) << 5) | fmi, (cm << 7) | oc]
}

function j1939CheckSpn(spn: number): void {
  // SPN is 19 bits wide.
  if (typeof spn !== 'number' || !Number.isInteger(spn) || spn < 0 || spn > 524287) {
    throw new RangeError(`J1939 SPN must be an integer 0–524287, got ${spn}`)
  }
}

function j1939CheckFmi(fmi: number): void {
  if (typeof fmi !== 'number' || !Number.isInteger(fmi) || fmi < 0 || fmi > 31) {
    throw new RangeError(`J1939 FMI must be an integer 0–31, got ${fmi}`)
  }
}

// Our own wording of the J1939-73 failure mode meanings; 22–30 carry no assigned meaning. For 0, 1
// and 15–18 the standard says the data are valid: the value is real, it is the condition that is wrong.
const FMI_TEXTS: readonly string[] = [
  'Data valid but above normal range (most severe level)',
  'Data valid but below normal range (most severe level)',
  'Value erratic, intermittent or incorrect',
  'Voltage above normal, or shorted to a high source',
  'Voltage below normal, or shorted to a low source',
  'Current below normal, or open circuit',
  'Current above normal, or circuit grounded',
  'Mechanical system not responding or out of adjustment',
  'Abnormal frequency, pulse width or period',
  'Abnormal update rate',
  'Abnormal rate of change',
  'Root cause not known',
  'Bad intelligent device or component',
  'Out of calibration',
  'Special instructions',
  'Data valid but above normal range (least severe level)',
  'Data valid but above normal range (moderately severe level)',
  'Data valid but below normal range (least severe level)',
  'Data valid but below normal range (moderately severe level)',
  'Received network data in error',
  'Data drifted high',
  'Data drifted low',
]

/** Plain-language meaning of a J1939 FMI (0–31). */
export function fmiText(fmi: number): string {
  j1939CheckFmi(fmi)
  if (fmi === 31) return 'Condition exists'
  return FMI_TEXTS[fmi] ?? `Reserved (FMI ${fmi} has no assigned meaning)`
}

/**
 * How a J1939 code failed, which decides what to test: a real condition (the data are valid: the
 * exhaust or the coolant really is too hot), a circuit, a signal, the network, a device, a mechanism.
 */
export type FmiKind = 'condition' | 'circuit' | 'signal' | 'network' | 'device' | 'mechanical' | 'other'

// Grouped from the J1939-73 FMI meanings above; 11, 14 and the unassigned 22–30 say nothing of how it failed.
const FMI_KINDS: Readonly<Record<number, FmiKind>> = {
  0: 'condition', 1: 'condition', 15: 'condition', 16: 'condition', 17: 'condition', 18: 'condition', 31: 'condition',
  3: 'circuit', 4: 'circuit', 5: 'circuit', 6: 'circuit',
  2: 'signal', 8: 'signal', 10: 'signal', 20: 'signal', 21: 'signal',
  9: 'network', 19: 'network',
  12: 'device', 13: 'device',
  7: 'mechanical',
}

/** The kind of failure a J1939 FMI (0–31) reports; see FmiKind. */
export function fmiKind(fmi: number): FmiKind {
  j1939CheckFmi(fmi)
  return FMI_KINDS[fmi] ?? 'other'
}

export interface Dm1Lamps {
  mil: boolean
  redStop: boolean
  amberWarning: boolean
  protect: boolean
}

export interface Dm1Dtc {
  spn: number
  fmi: number
  /** Occurrence count; null when the sender marks it not available (127). */
  oc: number | null
  cm: 0 | 1
}

export interface Dm1 {
  lamps: Dm1Lamps
  dtcs: Dm1Dtc[]
}

// A lamp's two bits: 00 off, 01 on, 10 error, 11 not available. Only 01 lights it.
const lampOn = (byte: number, shift: number) => ((byte >> shift) & 0x3) === 1

/**
 * The data of a J1939-73 DM1 (active codes) message: the lamp byte (MIL, red stop, amber warning,
 * protect, two bits each from the top), the lamp-flash byte, then 4 bytes per code. The no-fault
 * entry (SPN 0, FMI 0) and 0xFF filler are not codes; a code cut short is refused rather than guessed.
 */
export function parseDm1(data: number[]): Dm1 {
  if (!Array.isArray(data)) throw new RangeError('DM1 data must be a list of bytes')
  data.forEach((b, i) => dtcCheckByte(`DM1 byte ${i + 1}`, b))
  if (data.length < 2) {
    throw new RangeError(`DM1 data has ${data.length} byte(s): it needs at least the lamp byte and the flash byte`)
  }
  const lampByte = data[0]!
  const lamps: Dm1Lamps = {
    mil: lampOn(lampByte, 6),
    redStop: lampOn(lampByte, 4),
    amberWarning: lampOn(lampByte, 2),
    protect: lampOn(lampByte, 0),
  }
  const dtcs: Dm1Dtc[] = []
  for (let i = 2; i < data.length; i += 4) {
    const chunk = data.slice(i, i + 4)
    if (chunk.every(b => b === 0xff)) continue
    if (chunk.length < 4) {
      throw new RangeError(`DM1 code starting at byte ${i + 1} is cut short: ${chunk.length} of its 4 bytes are there`)
    }
    const d = decodeJ1939Dtc(chunk as [number, number, number, number])
    if (d.spn === 0 && d.fmi === 0) continue
    dtcs.push({ spn: d.spn, fmi: d.fmi, oc: d.oc === 127 ? null : d.oc, cm: d.cm })
  }
  return { lamps, dtcs }
}

// SPN names in Wayside's words, checked against the J1939 digital annex names that the Equipment &
// Tool Institute's open J1939-84 tool ships (REFERENCES.md, "SPN names").
const SPN_NAMES: Readonly<Record<number, string>> = {
  46: 'Air supply pressure',
  84: 'Vehicle speed (from the wheels)',
  91: 'Accelerator pedal position 1',
  100: 'Engine oil pressure',
  102: 'Boost pressure (intake manifold 1)',
  105: 'Intake manifold 1 temperature',
  108: 'Barometric pressure',
  110: 'Engine coolant temperature',
  111: 'Engine coolant level',
  114: 'Battery 1 net current',
  115: 'Alternator current',
  116: 'Brake application air pressure',
  117: 'Brake primary air pressure',
  118: 'Brake secondary air pressure',
  158: 'Battery voltage at the key switch',
  167: 'Charging system voltage',
  168: 'Battery voltage (power input 1)',
  171: 'Ambient air temperature',
  173: 'Engine exhaust temperature',
  175: 'Engine oil temperature',
  190: 'Engine speed',
  1569: 'Engine protection torque derate',
  1761: 'DEF tank level (after-treatment 1)',
  3216: 'NOx ahead of the SCR catalyst (after-treatment 1 intake NOx sensor)',
  3226: 'NOx after the SCR catalyst (after-treatment 1 outlet NOx sensor)',
  3241: 'Exhaust temperature 1 (after-treatment 1)',
  3242: 'DPF inlet temperature (after-treatment 1)',
  3246: 'DPF outlet temperature (after-treatment 1)',
  3251: 'DPF differential pressure (after-treatment 1)',
  3364: 'DEF quality in the tank (after-treatment 1)',
  3509: 'Sensor supply 1 voltage',
  3510: 'Sensor supply 2 voltage',
  3511: 'Sensor supply 3 voltage',
  3512: 'Sensor supply 4 voltage',
  3513: 'Sensor supply 5 voltage',
  3514: 'Sensor supply 6 voltage',
  3516: 'DEF concentration (after-treatment 1)',
  3719: 'DPF soot load (after-treatment 1)',
  4334: 'DEF doser pressure (after-treatment 1)',
  4765: 'DOC inlet temperature (after-treatment 1)',
  4766: 'DOC outlet temperature (after-treatment 1)',
}

/** The SPNs of our short table, for pick lists. */
export const KNOWN_SPNS: readonly { spn: number, name: string }[] = Object.entries(SPN_NAMES)
  .map(([spn, name]) => ({ spn: Number(spn), name }))

/** Name of a well-known SPN, or undefined when it is not in our short table. */
export function spnName(spn: number): string | undefined {
  j1939CheckSpn(spn)
  return SPN_NAMES[spn]
}

// Generic J2012 meanings of the codes Wayside's cards cover, in Wayside's words. Checked against the
// code titles python-OBD ships (P0xxx) and a published J2012 title list for P2xxx (REFERENCES.md,
// "J2012 code meanings"); rows marked "from memory" had no list to check against.
const DTC_MEANINGS: Readonly<Record<string, string>> = {
  P0115: 'Coolant temperature sensor circuit',
  P0116: 'Coolant temperature sensor reading out of range or implausible',
  P0117: 'Coolant temperature sensor circuit low',
  P0118: 'Coolant temperature sensor circuit high',
  P0119: 'Coolant temperature sensor circuit intermittent',
  P0217: 'Engine coolant over-temperature (a real condition, not a sensor circuit)',
  P0544: 'Exhaust temperature sensor circuit (bank 1, sensor 1)',
  P0545: 'Exhaust temperature sensor circuit low (bank 1, sensor 1)',
  P0546: 'Exhaust temperature sensor circuit high (bank 1, sensor 1)',
  P0547: 'Exhaust temperature sensor circuit (bank 2, sensor 1)',
  P0548: 'Exhaust temperature sensor circuit low (bank 2, sensor 1)',
  P0549: 'Exhaust temperature sensor circuit high (bank 2, sensor 1)',
  P0560: 'System voltage',
  P0561: 'System voltage unstable',
  P0562: 'System voltage low',
  P0563: 'System voltage high',
  P0620: 'Alternator control circuit',
  P0621: 'Alternator lamp (L terminal) circuit',
  P0622: 'Alternator field (F terminal) circuit',
  P0641: 'Sensor supply A circuit, or open',
  P0642: 'Sensor supply A circuit low',
  P0643: 'Sensor supply A circuit high',
  P0651: 'Sensor supply B circuit, or open',
  P0652: 'Sensor supply B circuit low',
  P0653: 'Sensor supply B circuit high',
  P0697: 'Sensor supply C circuit, or open',
  P0698: 'Sensor supply C circuit low',
  P0699: 'Sensor supply C circuit high',
  P2002: 'DPF efficiency below threshold (bank 1)', // from memory
  P2031: 'Exhaust temperature sensor circuit (bank 1, sensor 2)',
  P2032: 'Exhaust temperature sensor circuit low (bank 1, sensor 2)',
  P2033: 'Exhaust temperature sensor circuit high (bank 1, sensor 2)',
  P2034: 'Exhaust temperature sensor circuit (bank 2, sensor 2)',
  P2035: 'Exhaust temperature sensor circuit low (bank 2, sensor 2)',
  P2036: 'Exhaust temperature sensor circuit high (bank 2, sensor 2)',
  P207F: 'DEF quality out of range', // from memory
  P2080: 'Exhaust temperature sensor reading out of range or implausible (bank 1, sensor 1)',
  P2081: 'Exhaust temperature sensor circuit intermittent (bank 1, sensor 1)',
  P2082: 'Exhaust temperature sensor reading out of range or implausible (bank 2, sensor 1)',
  P2083: 'Exhaust temperature sensor circuit intermittent (bank 2, sensor 1)',
  P2084: 'Exhaust temperature sensor reading out of range or implausible (bank 1, sensor 2)',
  P2085: 'Exhaust temperature sensor circuit intermittent (bank 1, sensor 2)',
  P2086: 'Exhaust temperature sensor reading out of range or implausible (bank 2, sensor 2)',
  P2087: 'Exhaust temperature sensor circuit intermittent (bank 2, sensor 2)',
  P20EC: 'SCR catalyst over-temperature (bank 1)',
  P20EE: 'SCR catalyst NOx conversion below threshold (bank 1)',
  P2200: 'NOx sensor circuit (bank 1)', // from memory
  P2201: 'NOx sensor reading out of range or implausible (bank 1)', // from memory
  P2202: 'NOx sensor circuit low (bank 1)', // from memory
  P2203: 'NOx sensor circuit high (bank 1)', // from memory
  P2452: 'DPF differential pressure sensor A circuit', // from memory
  P2453: 'DPF differential pressure sensor A reading out of range or implausible', // from memory
  P2454: 'DPF differential pressure sensor A circuit low', // from memory
  P2455: 'DPF differential pressure sensor A circuit high', // from memory
}

/** The codes of our short J2012 table with their meanings, for pick lists. */
export const KNOWN_DTCS: readonly { code: string, meaning: string }[] = Object.entries(DTC_MEANINGS)
  .map(([code, meaning]) => ({ code, meaning }))

/** Generic meaning of a J2012 code, or undefined when it is not in our short table. Throws on a malformed code. */
export function dtcMeaning(code: string): string | undefined {
  return DTC_MEANINGS[parseDtc(code).code]
}

export interface FaultCodeDescription {
  label: string
  system?: DtcSystem
  generic?: boolean
  group?: string
  /** What the code means (J2012 codes in our short table); show it before the group, which only says where the code sits. */
  meaning?: string
  spnName?: string
  fmiText?: string
}

/**
 * What to show for a recorded fault code: either a J2012 `code` or a J1939 `spn` + `fmi`.
 * `label` is the short identifier ('P0118', 'SPN 110 FMI 0'); the other fields describe it.
 */
export function describeFaultCode(input: { code?: string | null, spn?: number | null, fmi?: number | null }): FaultCodeDescription {
  const hasCode = typeof input.code === 'string' && input.code.trim() !== ''
  const hasSpn = input.spn !== undefined && input.spn !== null
  const hasFmi = input.fmi !== undefined && input.fmi !== null
  if (hasCode && (hasSpn || hasFmi)) throw new RangeError('Give either a J2012 code or a J1939 SPN/FMI, not both')
  if (hasCode) {
    const p = parseDtc(input.code as string)
    const out: FaultCodeDescription = { label: p.code, system: p.system, generic: p.generic, group: p.group }
    const meaning = DTC_MEANINGS[p.code]
    if (meaning !== undefined) out.meaning = meaning
    return out
  }
  if (hasSpn && hasFmi) {
    const spn = input.spn as number
    const fmi = input.fmi as number
    const name = spnName(spn)
    const out: FaultCodeDescription = { label: `SPN ${spn} FMI ${fmi}`, fmiText: fmiText(fmi) }
    if (name !== undefined) out.spnName = name
    return out
  }
  if (hasSpn || hasFmi) throw new RangeError('A J1939 fault code needs both SPN and FMI')
  throw new RangeError('No fault code given: expected a J2012 code or a J1939 SPN and FMI')
}
