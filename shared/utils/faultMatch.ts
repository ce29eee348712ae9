// Which test cards fit a call's fault codes, and whether a code came back after a repair.
// A card lists the codes it applies to as patterns: 'P0544' (one code), 'P20*' (a J2012 prefix),
// 'P2080-P2084' (a J2012 range), 'SPN 3242' or 'SPN 173 FMI *' (an SPN with any FMI),
// 'SPN 110 FMI 3' (one SPN/FMI pair) and 'SPN 3242 FMI circuit' (an SPN with one kind of FMI).
// The kind of FMI says how the code failed: a circuit or signal fault points at the sensor and its
// wiring, a data-valid one (FMI 0, 1, 15–18, 31) at a real condition the sensor reports.
import { fmiKind, parseDtc, type FmiKind } from './dtc'

export const FMI_KINDS = ['condition', 'circuit', 'signal', 'network', 'device', 'mechanical', 'other'] as const satisfies
  readonly FmiKind[]
export const FMI_KIND_LABELS: Record<FmiKind, string> = {
  condition: 'data valid: a real condition (FMI 0, 1, 15–18, 31)',
  circuit: 'circuit: voltage or current out of range (FMI 3–6)',
  signal: 'signal: erratic, drifted or wrong rate (FMI 2, 8, 10, 20, 21)',
  network: 'network data (FMI 9, 19)',
  device: 'bad device or calibration (FMI 12, 13)',
  mechanical: 'mechanical system not responding (FMI 7)',
  other: 'other FMIs',
}

/** What a card is for; it decides which FMI kinds its SPN patterns may name. */
export const CARD_KINDS = ['sensor_circuit', 'condition', 'system'] as const
export type CardKind = (typeof CARD_KINDS)[number]
/** FMI kinds each card kind applies to (null: any). */
export const CARD_KIND_FMIS: Record<CardKind, readonly FmiKind[] | null> = {
  sensor_circuit: ['circuit', 'signal'],
  condition: ['condition'],
  system: null,
}

export interface FaultCodeRef {
  code?: string | null
  spn?: number | null
  fmi?: number | null
}

export type CodePattern
  = | { form: 'j2012', prefix: string, exact: boolean }
    | { form: 'j2012_range', from: string, to: string }
    | { form: 'j1939', spn: number, fmi: number | null, kind: FmiKind | null }

const J2012_PATTERN = /^([PCBU][0-3][0-9A-F]{0,3})(\*?)$/
const J2012_RANGE = /^([PCBU][0-3][0-9A-F]{3})\s*[-–]\s*([PCBU][0-3][0-9A-F]{3})$/
const J1939_PATTERN = /^SPN\s*(\d{1,6})(?:\s+FMI\s*(\d{1,2}|\*|[A-Z]+))?$/
const EXAMPLES = 'write P0544, P20* or P2080-P2084 for J2012 codes; '
  + 'SPN 3242, SPN 3242 FMI 4, SPN 3242 FMI * or SPN 3242 FMI circuit for J1939'

function checkSpn(spn: number, pattern: string) {
  if (spn > 524287) throw new RangeError(`"${pattern}": SPN must be 0–524287`)
}

/** Read a card's code pattern; throws naming what is wrong. */
export function parseCodePattern(pattern: string): CodePattern {
  if (typeof pattern !== 'string') throw new RangeError(`A code pattern must be text: ${EXAMPLES}`)
  const p = pattern.trim().toUpperCase()
  const j = J1939_PATTERN.exec(p)
  if (j) {
    const spn = Number(j[1])
    checkSpn(spn, pattern)
    const f = j[2]
    if (f === undefined || f === '*') return { form: 'j1939', spn, fmi: null, kind: null }
    if (/^\d+$/.test(f)) {
      const fmi = Number(f)
      if (fmi > 31) throw new RangeError(`"${pattern}": FMI must be 0–31`)
      return { form: 'j1939', spn, fmi, kind: null }
    }
    const kind = f.toLowerCase() as FmiKind
    if (!(FMI_KINDS as readonly string[]).includes(kind)) {
      throw new RangeError(`"${pattern}": after FMI write a number 0–31, * or a kind (${FMI_KINDS.join(', ')})`)
    }
    return { form: 'j1939', spn, fmi: null, kind }
  }
  const r = J2012_RANGE.exec(p)
  if (r) {
    const [from, to] = [r[1]!, r[2]!]
    if (from.slice(0, 2) !== to.slice(0, 2)) {
      throw new RangeError(`"${pattern}": both ends of a range start with the same two characters (like P2080-P2084)`)
    }
    if (hexTail(from) > hexTail(to)) throw new RangeError(`"${pattern}": the range runs backwards; write the lower code first`)
    return { form: 'j2012_range', from, to }
  }
  const m = J2012_PATTERN.exec(p)
  if (m) {
    const prefix = m[1]!
    const star = m[2] === '*'
    if (!star && prefix.length !== 5) {
      throw new RangeError(`"${pattern}": a J2012 code has 5 characters; end a shorter one with * (like P20*)`)
    }
    return { form: 'j2012', prefix, exact: prefix.length === 5 }
  }
  throw new RangeError(`"${pattern}" is not a code pattern: ${EXAMPLES}`)
}

/** A pattern as a card keeps it: codes in capitals, an FMI kind in lower case ('SPN 3242 FMI circuit'). */
export function normalizeCodePattern(pattern: string): string {
  const p = parseCodePattern(pattern)
  if (p.form === 'j2012') return p.exact ? p.prefix : `${p.prefix}*`
  if (p.form === 'j2012_range') return `${p.from}-${p.to}`
  if (p.kind) return `SPN ${p.spn} FMI ${p.kind}`
  return p.fmi === null ? `SPN ${p.spn} FMI *` : `SPN ${p.spn} FMI ${p.fmi}`
}

/** FMI kinds a J1939 pattern can match: its kind, its one FMI's kind, or null for any. */
export function patternFmiKinds(p: CodePattern): FmiKind[] | null {
  if (p.form !== 'j1939') return []
  if (p.kind) return [p.kind]
  if (p.fmi !== null) return [fmiKind(p.fmi)]
  return null
}

/**
 * Why a card of this kind may not list this pattern, or null when it may. A sensor-circuit card
 * answers circuit and signal FMIs only; a condition card data-valid ones only.
 */
export function patternProblemForKind(pattern: string, kind: CardKind): string | null {
  const allowed = CARD_KIND_FMIS[kind]
  if (!allowed) return null
  const p = parseCodePattern(pattern)
  const kinds = patternFmiKinds(p)
  const spn = p.form === 'j1939' ? p.spn : 0
  const fix = kind === 'sensor_circuit' ? `SPN ${spn} FMI circuit and SPN ${spn} FMI signal` : `SPN ${spn} FMI condition`
  if (kinds === null) return `"${pattern}" takes every FMI; this card fits only ${allowed.join(' and ')} FMIs: write ${fix}`
  const wrong = kinds.find(k => !allowed.includes(k))
  return wrong ? `"${pattern}" is a ${wrong} FMI; this card fits only ${allowed.join(' and ')} FMIs` : null
}

function faultForm(f: FaultCodeRef): { code: string } | { spn: number, fmi: number } {
  if (typeof f.code === 'string' && f.code.trim() !== '') return { code: parseDtc(f.code).code }
  if (typeof f.spn === 'number' && typeof f.fmi === 'number' && Number.isInteger(f.spn) && Number.isInteger(f.fmi)) {
    if (f.spn < 0 || f.spn > 524287) throw new RangeError(`SPN must be 0–524287, got ${f.spn}`)
    if (f.fmi < 0 || f.fmi > 31) throw new RangeError(`FMI must be 0–31, got ${f.fmi}`)
    return { spn: f.spn, fmi: f.fmi }
  }
  throw new RangeError('A fault code needs a J2012 code or both SPN and FMI')
}

const hexTail = (code: string) => parseInt(code.slice(2), 16)

/** Whether one recorded fault code fits a pattern. */
export function codeMatchesPattern(pattern: string | CodePattern, fault: FaultCodeRef): boolean {
  const p = typeof pattern === 'string' ? parseCodePattern(pattern) : pattern
  const f = faultForm(fault)
  if (p.form === 'j2012') return 'code' in f && (p.exact ? f.code === p.prefix : f.code.startsWith(p.prefix))
  if (p.form === 'j2012_range') {
    if (!('code' in f) || f.code.slice(0, 2) !== p.from.slice(0, 2)) return false
    return hexTail(f.code) >= hexTail(p.from) && hexTail(f.code) <= hexTail(p.to)
  }
  if (!('spn' in f) || f.spn !== p.spn) return false
  if (p.fmi !== null) return p.fmi === f.fmi
  return p.kind === null || p.kind === fmiKind(f.fmi)
}

// More specific patterns rank first: an exact code or SPN/FMI, then an FMI kind or a code range,
// then an SPN with any FMI, then a prefix.
function specificity(p: CodePattern): number {
  if (p.form === 'j1939') return p.fmi !== null ? 10 : p.kind ? 8 : 6
  if (p.form === 'j2012_range') return 8
  return p.exact ? 10 : p.prefix.length
}

/** The short label of a fault code, 'P0118' or 'SPN 110 FMI 0'; also the key for history. */
export function faultCodeKey(fault: FaultCodeRef): string {
  const f = faultForm(fault)
  return 'code' in f ? f.code : `SPN ${f.spn} FMI ${f.fmi}`
}

/**
 * A fault code as typed: 'P0545', 'p0545', 'SPN 3242 FMI 4' (spaces optional). Throws naming
 * what is wrong, so a list of codes can answer which one it could not read.
 */
export function parseFaultCodeText(text: string): { code: string } | { spn: number, fmi: number } {
  if (typeof text !== 'string' || !text.trim()) throw new RangeError('Empty fault code: write P0545 or SPN 3242 FMI 4')
  const t = text.trim().toUpperCase()
  const j = /^SPN\s*(\d{1,6})\s*FMI\s*(\d{1,2})$/.exec(t)
  if (j) return faultForm({ spn: Number(j[1]), fmi: Number(j[2]) }) as { spn: number, fmi: number }
  if (t.startsWith('SPN')) throw new RangeError(`"${text}" is not a J1939 code: write SPN 3242 FMI 4`)
  return { code: parseDtc(t).code }
}

export interface CardSuggestion<C> {
  card: C
  /** Labels of the call's codes this card fits. */
  matches: string[]
  score: number
}

/** A card as the picker reads it: its code patterns and what kind of card it is. */
export interface MatchableCard {
  codePatterns?: readonly string[]
  kind?: CardKind
}

/**
 * Cards that fit any of the call's fault codes, best fit first (more codes matched, then more
 * specific patterns). Codes that cannot be read are skipped rather than hiding every suggestion.
 * A card's kind is kept even when a pattern says otherwise: a data-valid J1939 code never
 * suggests a sensor-circuit card, nor a circuit code a condition card.
 */
export function suggestCards<C extends MatchableCard>(cards: readonly C[], faults: readonly FaultCodeRef[]): CardSuggestion<C>[] {
  const out: CardSuggestion<C>[] = []
  const readable = faults.flatMap((f) => {
    try {
      return [{ f, form: faultForm(f) }]
    }
    catch {
      return []
    }
  })
  for (const card of cards) {
    const patterns = (card.codePatterns ?? []).flatMap((s) => {
      try { return [parseCodePattern(s)] }
      catch { return [] }
    })
    const allowed = CARD_KIND_FMIS[card.kind ?? 'system']
    const matches: string[] = []
    let score = 0
    for (const { f, form } of readable) {
      if (allowed && 'fmi' in form && !allowed.includes(fmiKind(form.fmi))) continue
      const best = Math.max(0, ...patterns.filter(p => codeMatchesPattern(p, f)).map(specificity))
      if (best > 0) { matches.push(faultCodeKey(f)); score += best }
    }
    if (matches.length) out.push({ card, matches: [...new Set(matches)], score })
  }
  return out.sort((a, b) => b.matches.length - a.matches.length || b.score - a.score)
}

/** suggestCards over library cards (the shape GET /api/test-cards answers). */
export function suggestTestCards<C extends { definition: MatchableCard }>(cards: readonly C[], faults: readonly FaultCodeRef[]) {
  const wrapped = cards.map(c => ({ codePatterns: c.definition.codePatterns, kind: c.definition.kind, view: c }))
  return suggestCards(wrapped, faults).map((s): CardSuggestion<C> => ({ card: s.card.view, matches: s.matches, score: s.score }))
}

export interface FaultHistoryEntry extends FaultCodeRef {
  id: string
  callId: string
  /** When it was recorded (device time of the record, or the server's creation time). */
  seenAt: string | Date
  clearedAt?: string | Date | null
}

function when(name: string, v: string | Date, id: string): number {
  const t = v instanceof Date ? v.getTime() : typeof v === 'string' ? Date.parse(v) : Number.NaN
  if (Number.isNaN(t)) throw new RangeError(`Fault code ${id}: ${name} is not a date (${String(v)})`)
  return t
}

/**
 * The 'returned' rule over one unit's fault-code history: a code has returned when the same code
 * (same J2012 code, or same SPN and FMI) was cleared earlier, on this call or a past one, and is
 * seen again after that clearing. Returns, for each returned entry's id, the cleared entry it
 * came back after (the latest such clearing).
 */
export function returnedFaultCodes(history: readonly FaultHistoryEntry[]): Map<string, FaultHistoryEntry> {
  if (!Array.isArray(history)) throw new RangeError('Fault-code history must be a list')
  const rows = history.map((h) => {
    if (!h || typeof h.id !== 'string') throw new RangeError('Each fault-code history entry needs an id')
    return {
      h,
      key: faultCodeKey(h),
      seen: when('seenAt', h.seenAt, h.id),
      cleared: h.clearedAt === null || h.clearedAt === undefined ? null : when('clearedAt', h.clearedAt, h.id),
    }
  })
  const out = new Map<string, FaultHistoryEntry>()
  for (const r of rows) {
    let after: (typeof rows)[number] | undefined
    for (const p of rows) {
      if (p === r || p.key !== r.key || p.cleared === null) continue
      // Cleared before this sighting, and the sighting is not the cleared record itself.
      if (p.cleared <= r.seen && p.seen <= r.seen && (!after || p.cleared > after.cleared!)) after = p
    }
    if (after) out.set(r.h.id, after.h)
  }
  return out
}

/** Whether one entry of a unit's history is a returned code (see returnedFaultCodes). */
export function isReturnedFaultCode(entry: FaultHistoryEntry, history: readonly FaultHistoryEntry[]): boolean {
  const all = history.some(h => h.id === entry.id) ? history : [...history, entry]
  return returnedFaultCodes(all).has(entry.id)
}
