// 17-character VIN per 49 CFR 565. The check digit catches most typing slips, but older and
// non-North-American VINs may not carry one, so a form treats a wrong check digit as a warning.

const VIN_VALUES: Readonly<Record<string, number>> = {
  A: 1, B: 2, C: 3, D: 4, E: 5, F: 6, G: 7, H: 8,
  J: 1, K: 2, L: 3, M: 4, N: 5, P: 7, R: 9,
  S: 2, T: 3, U: 4, V: 5, W: 6, X: 7, Y: 8, Z: 9,
  0: 0, 1: 1, 2: 2, 3: 3, 4: 4, 5: 5, 6: 6, 7: 7, 8: 8, 9: 9,
}
const VIN_WEIGHTS = [8, 7, 6, 5, 4, 3, 2, 10, 0, 9, 8, 7, 6, 5, 4, 3, 2] as const

export type VinProblemKind = 'length' | 'letters' | 'characters' | 'check_digit'

// Mechanics type VINs from a door label; case and stray edge spaces are not errors.
const vinNormalize = (vin: string) => vin.trim().toUpperCase()

function vinStructureProblem(v: string): { kind: VinProblemKind, reason: string } | null {
  if (v.length !== 17) return { kind: 'length', reason: `A VIN has 17 characters; this one has ${v.length}` }
  const forbidden = [...new Set(v.match(/[IOQ]/g) ?? [])]
  if (forbidden.length > 0) {
    return { kind: 'letters', reason: `A VIN never contains the letters I, O or Q (found ${forbidden.join(', ')}); check for 1 or 0` }
  }
  const bad = [...new Set(v.match(/[^A-Z0-9]/g) ?? [])]
  if (bad.length > 0) {
    return { kind: 'characters', reason: `A VIN holds only letters and digits (found ${bad.map(c => JSON.stringify(c)).join(', ')})` }
  }
  return null
}

/** The check digit (position 9) a VIN should carry: '0'–'9' or 'X'. Throws if the VIN is not 17 valid characters. */
export function vinCheckDigit(vin: string): string {
  if (typeof vin !== 'string') throw new TypeError('VIN must be text')
  const v = vinNormalize(vin)
  const problem = vinStructureProblem(v)
  if (problem) throw new RangeError(problem.reason)
  let sum = 0
  for (let i = 0; i < 17; i++) sum += (VIN_VALUES[v.charAt(i)] ?? 0) * (VIN_WEIGHTS[i] ?? 0)
  const rem = sum % 11
  return rem === 10 ? 'X' : String(rem)
}

/** The first thing wrong with a VIN, or null. 'check_digit' is the only kind that may be a warning. */
export function vinProblem(vin: string): { kind: VinProblemKind, reason: string } | null {
  if (typeof vin !== 'string') return { kind: 'characters', reason: 'A VIN must be text' }
  const v = vinNormalize(vin)
  const problem = vinStructureProblem(v)
  if (problem) return problem
  const expected = vinCheckDigit(v)
  const actual = v.charAt(8)
  if (actual !== expected) {
    return {
      kind: 'check_digit',
      reason: `Check digit (9th character) is ${actual} but the rest of the VIN gives ${expected}: recheck each character`,
    }
  }
  return null
}

/** Full VIN check, check digit included. */
export function validateVin(vin: string): { ok: true } | { ok: false, reason: string } {
  const p = vinProblem(vin)
  return p ? { ok: false, reason: p.reason } : { ok: true }
}

/**
 * The VIN in what a barcode held, or null when it holds none. Door-jamb and windshield labels
 * carry it in Code 39 or Data Matrix, alone, after a label word ("VIN:") or, on some imported
 * vehicles' Code 39, after a leading "I" (from memory); spaces and dashes between groups are dropped.
 */
export function vinFromScan(text: string): string | null {
  const runs = text.toUpperCase().replace(/[\s-]/g, '').match(/[A-Z0-9]+/g) ?? []
  for (const run of runs) {
    if (run.length === 17) return run
    if (run.length === 18 && run.startsWith('I')) return run.slice(1)
    // A label word run together with the VIN ("VIN1WSTR…"): the VIN is the last 17 characters.
    if (run.length > 17 && /^VIN/.test(run) && run.length === 20) return run.slice(3)
  }
  return null
}
