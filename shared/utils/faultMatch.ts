// Which test cards fit a call's fault codes, and whether a code came back after a repair.
// A card lists the codes it applies to as patterns: 'P0544' (one code), 'P20*' (a J2012 prefix),
// 'SPN 3242' or 'SPN 173 FMI *' (an SPN with any FMI), 'SPN 110 FMI 3' (one SPN/FMI pair).
import { parseDtc } from './dtc'

export interface FaultCodeRef {
  code?: string | null
  spn?: number | null
  fmi?: number | null
}

export type CodePattern
  = | { form: 'j2012', prefix: string, exact: boolean }
    | { form: 'j1939', spn: number, fmi: number | null }

const J2012_PATTERN = /^([PCBU][0-3][0-9A-F]{0,3})(\*?)$/
const J1939_PATTERN = /^SPN\s+(\d{1,6})(?:\s+FMI\s+(\d{1,2}|\*))?$/

/** Read a card's code pattern; throws naming what is wrong. */
export function parseCodePattern(pattern: string): CodePattern {
  if (typeof pattern !== 'string') throw new RangeError('A code pattern must be text like P0544, P20* or SPN 3242 FMI *')
  const p = pattern.trim().toUpperCase()
  const j = J1939_PATTERN.exec(p)
  if (j) {
    const spn = Number(j[1])
    if (spn > 524287) throw new RangeError(`"${pattern}": SPN must be 0–524287`)
    const fmi = j[2] === undefined || j[2] === '*' ? null : Number(j[2])
    if (fmi !== null && fmi > 31) throw new RangeError(`"${pattern}": FMI must be 0–31`)
    return { form: 'j1939', spn, fmi }
  }
  const m = J2012_PATTERN.exec(p)
  if (m) {
    const prefix = m[1]!
    const star = m[2] === '*'
    if (!star && prefix.length !== 5) throw new RangeError(`"${pattern}": a J2012 code has 5 characters; end a shorter one with * (like P20*)`)
    return { form: 'j2012', prefix, exact: prefix.length === 5 }
  }
  throw new RangeError(`"${pattern}" is not a code pattern: write P0544 or P20* for J2012 codes, SPN 3242, SPN 173 FMI * or SPN 110 FMI 3 for J1939`)
}

function faultForm(f: FaultCodeRef): { code: string } | { spn: number, fmi: number } {
  if (typeof f.code === 'string' && f.code.trim() !== '') return { code: parseDtc(f.code).code }
  if (typeof f.spn === 'number' && typeof f.fmi === 'number' && Number.isInteger(f.spn) && Number.isInteger(f.fmi)) return { spn: f.spn, fmi: f.fmi }
  throw new RangeError('A fault code needs a J2012 code or both SPN and FMI')
}

/** Whether one recorded fault code fits a pattern. */
export function codeMatchesPattern(pattern: string | CodePattern, fault: FaultCodeRef): boolean {
  const p = typeof pattern === 'string' ? parseCodePattern(pattern) : pattern
  const f = faultForm(fault)
  if (p.form === 'j2012') return 'code' in f && (p.exact ? f.code === p.prefix : f.code.startsWith(p.prefix))
  return 'spn' in f && f.spn === p.spn && (p.fmi === null || p.fmi === f.fmi)
}

// More specific patterns rank first: an exact code or SPN/FMI over an SPN alone over a prefix.
function specificity(p: CodePattern): number {
  if (p.form === 'j1939') return p.fmi === null ? 6 : 10
  return p.exact ? 10 : p.prefix.length
}

/** The short label of a fault code, 'P0118' or 'SPN 110 FMI 0'; also the key for history. */
export function faultCodeKey(fault: FaultCodeRef): string {
  const f = faultForm(fault)
  return 'code' in f ? f.code : `SPN ${f.spn} FMI ${f.fmi}`
}

export interface CardSuggestion<C> {
  card: C
  /** Labels of the call's codes this card fits. */
  matches: string[]
  score: number
}

/**
 * Cards that fit any of the call's fault codes, best fit first (more codes matched, then more
 * specific patterns). Codes that cannot be read are skipped rather than hiding every suggestion.
 */
export function suggestCards<C extends { codePatterns?: readonly string[] }>(cards: readonly C[], faults: readonly FaultCodeRef[]): CardSuggestion<C>[] {
  const out: CardSuggestion<C>[] = []
  const readable = faults.filter((f) => {
    try { faultForm(f); return true }
    catch { return false }
  })
  for (const card of cards) {
    const patterns = (card.codePatterns ?? []).flatMap((s) => {
      try { return [parseCodePattern(s)] }
      catch { return [] }
    })
    const matches: string[] = []
    let score = 0
    for (const f of readable) {
      const best = Math.max(0, ...patterns.filter(p => codeMatchesPattern(p, f)).map(specificity))
      if (best > 0) { matches.push(faultCodeKey(f)); score += best }
    }
    if (matches.length) out.push({ card, matches: [...new Set(matches)], score })
  }
  return out.sort((a, b) => b.matches.length - a.matches.length || b.score - a.score)
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
