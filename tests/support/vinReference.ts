// A VIN check digit independent of shared/utils/vin.ts (49 CFR 565.15(c)), for tests: letters valued by their place in
// the alphabet in three runs (A–I = 1–9, J–R = 1–9, S–Z = 2–9), weights from the position formula.
// Deliberately no lookup tables, so a typo in the module's tables cannot be copied here.
export function refValue(ch: string): number {
  const x = ch.charCodeAt(0)
  if (x >= 48 && x <= 57) return x - 48
  const i = x - 65
  if (i < 9) return i + 1
  if (i < 18) return i - 8
  return i - 16
}
function refWeight(pos: number): number {
  if (pos <= 7) return 9 - pos
  if (pos === 8) return 10
  if (pos === 9) return 0
  return 19 - pos
}
export function refCheckDigit(vin: string): string {
  let sum = 0
  for (let p = 1; p <= 17; p++) sum += refValue(vin.charAt(p - 1)) * refWeight(p)
  const r = sum % 11
  return r === 10 ? 'X' : String(r)
}

/** An invented 17-character VIN with its 9th character set to the check digit 49 CFR 565 gives. */
export function withCheckDigit(vin: string): string {
  return vin.slice(0, 8) + refCheckDigit(vin) + vin.slice(9)
}
