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

// Our own wording of the J1939-73 failure mode meanings; 22–30 carry no assigned meaning.
const FMI_TEXTS: readonly string[] = [
  'Value above normal range (most severe level)',
  'Value below normal range (most severe level)',
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
  'Value above normal range (least severe level)',
  'Value above normal range (moderately severe level)',
  'Value below normal range (least severe level)',
  'Value below normal range (moderately severe level)',
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

// A few SPNs every road-call mechanic meets. 110, 175, 190 are from REFERENCES.md (J1939-71);
// the rest are from memory of J1939-71 names and should be confirmed before anything rests on them.
const SPN_NAMES: Readonly<Record<number, string>> = {
  84: 'Wheel-based vehicle speed', // from memory
  91: 'Accelerator pedal position 1', // from memory
  100: 'Engine oil pressure', // from memory
  102: 'Engine intake manifold 1 pressure (boost)', // from memory
  105: 'Engine intake manifold 1 temperature', // from memory
  110: 'Engine coolant temperature',
  111: 'Engine coolant level', // from memory
  168: 'Battery potential (power input 1)', // from memory
  171: 'Ambient air temperature', // from memory
  175: 'Engine oil temperature',
  190: 'Engine speed',
}

/** The SPNs of our short table, for pick lists. */
export const KNOWN_SPNS: readonly { spn: number, name: string }[] = Object.entries(SPN_NAMES).map(([spn, name]) => ({ spn: Number(spn), name }))

/** Name of a well-known SPN, or undefined when it is not in our short table. */
export function spnName(spn: number): string | undefined {
  j1939CheckSpn(spn)
  return SPN_NAMES[spn]
}

export interface FaultCodeDescription {
  label: string
  system?: DtcSystem
  generic?: boolean
  group?: string
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
    return { label: p.code, system: p.system, generic: p.generic, group: p.group }
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
