import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { validateVin, vinCheckDigit, vinFromScan, vinProblem } from '../../shared/utils/vin'
import { refCheckDigit, refValue } from '../support/vinReference'

// Reference VINs built for these tests (invented, not real vehicles); check digit by refCheckDigit.
const OUR_VINS = [
  '1WSTR42HXRA100001',
  '2WYDE5JK2SB204517',
  '3WXCN8LM3TC300288',
  '4WAYS1DE5VD419930',
  '5WRDT7CV6WE512345',
  '1W9HX4ZZ2XF600777',
  '2WKPL6AB8YG700016',
  '3WNUV3GH21H801234',
  '4WBCE2RT42J999999',
  '5WFMS8YZ53K000042',
]

describe('vinCheckDigit', () => {
  it('widely published worked example 1M8GDM9AXKP042788 -> X', () => {
    // 49 CFR 565 worked example (REFERENCES.md §5): 1M8GDM9AXKP042788 -> X
    expect(vinCheckDigit('1M8GDM9AXKP042788')).toBe('X')
    // independent implementation agrees on the same 49 CFR 565 worked example
    expect(refCheckDigit('1M8GDM9AXKP042788')).toBe('X')
  })

  it.each(OUR_VINS)('our reference VIN %s', (vin) => {
    // 49 CFR 565 check digit, cross-checked by the independent implementation in this file
    expect(refCheckDigit(vin)).toBe(vin.charAt(8))
    expect(vinCheckDigit(vin)).toBe(vin.charAt(8))
    expect(validateVin(vin)).toEqual({ ok: true })
  })

  it('agrees with the independent implementation on random VINs', () => {
    // 49 CFR 565 check digit, two independent implementations must agree
    const vinChar = fc.constantFrom(...'0123456789ABCDEFGHJKLMNPRSTUVWXYZ'.split(''))
    fc.assert(
      fc.property(fc.array(vinChar, { minLength: 17, maxLength: 17 }), (chars) => {
        const v = chars.join('')
        return vinCheckDigit(v) === refCheckDigit(v)
      }),
      { numRuns: 2000 },
    )
  })

  it('forgives lower case and edge spaces', () => {
    // 49 CFR 565 worked example, typed in lower case
    expect(vinCheckDigit(' 1m8gdm9axkp042788 ')).toBe('X')
  })

  it('throws on a VIN it cannot compute', () => {
    // our own input contract (49 CFR 565: 17 characters, no I, O, Q)
    expect(() => vinCheckDigit('1M8GDM9AXKP04278')).toThrow(RangeError)
    expect(() => vinCheckDigit('1M8GDM9AXKP0427O8')).toThrow(RangeError)
    expect(() => vinCheckDigit('1M8GDM9AXKP0427-8')).toThrow(RangeError)
    expect(() => vinCheckDigit(null as unknown as string)).toThrow(TypeError)
  })
})

describe('validateVin and vinProblem', () => {
  it('rejects the wrong length', () => {
    // 49 CFR 565: a VIN is 17 characters
    expect(vinProblem('1M8GDM9AXKP04278')?.kind).toBe('length')
    expect(vinProblem('1M8GDM9AXKP0427888')?.kind).toBe('length')
    expect(vinProblem('')?.kind).toBe('length')
    const r = validateVin('1M8GDM9AXKP04278')
    expect(r.ok).toBe(false)
    if (!r.ok) expect(r.reason).toMatch(/17/)
  })

  it('rejects I, O and Q', () => {
    // 49 CFR 565: the letters I, O and Q are never used
    for (const bad of ['1M8GDM9AXKP0427I8', '1M8GDM9AXKP0427O8', '1M8GDM9AXKP0427Q8']) {
      expect(vinProblem(bad)?.kind).toBe('letters')
      const r = validateVin(bad)
      expect(r.ok).toBe(false)
      if (!r.ok) expect(r.reason).toMatch(/I, O or Q/)
    }
  })

  it('rejects characters that are not letters or digits', () => {
    // 49 CFR 565: VIN characters are capital letters and digits only
    expect(vinProblem('1M8GDM9AXKP0427-8')?.kind).toBe('characters')
    expect(vinProblem('1M8GDM9AXKP0427 8')?.kind).toBe('characters')
    expect(vinProblem('1M8GDM9AXKP0427É8')?.kind).toBe('characters')
  })

  it('rejects a wrong check digit as its own kind', () => {
    // 49 CFR 565 worked example with the check digit changed from X to 5
    const p = vinProblem('1M8GDM9A5KP042788')
    expect(p?.kind).toBe('check_digit')
    expect(p?.reason).toMatch(/X/)
    expect(validateVin('1M8GDM9A5KP042788').ok).toBe(false)
    // one-character typo in our reference VIN is caught by the check digit (49 CFR 565)
    expect(vinProblem('1WSTR42HXRA100002')?.kind).toBe('check_digit')
  })

  it('accepts the worked example', () => {
    // 49 CFR 565 worked example (REFERENCES.md §5)
    expect(validateVin('1M8GDM9AXKP042788')).toEqual({ ok: true })
    expect(vinProblem('1M8GDM9AXKP042788')).toBeNull()
  })
})

describe('what the check digit can and cannot catch', () => {
  const VIN_CHARS = '0123456789ABCDEFGHJKLMNPRSTUVWXYZ'.split('')
  it('catches every single-character slip that changes the character value, at any weighted position', () => {
    // arithmetic of 49 CFR 565: weights 1–10 and value differences 1–9 are never 0 mod 11 (11 is prime)
    fc.assert(fc.property(
      fc.array(fc.constantFrom(...VIN_CHARS), { minLength: 17, maxLength: 17 }),
      fc.integer({ min: 0, max: 16 }).filter(i => i !== 8),
      fc.constantFrom(...VIN_CHARS),
      (chars, pos, replacement) => {
        const good = chars.join('')
        const withCheck = good.slice(0, 8) + vinCheckDigit(good) + good.slice(9)
        const slipped = withCheck.slice(0, pos) + replacement + withCheck.slice(pos + 1)
        if (refValue(replacement) === refValue(withCheck.charAt(pos))) return vinProblem(slipped) === null
        return vinProblem(slipped)?.kind === 'check_digit'
      },
    ), { numRuns: 3000 })
  })

  it('cannot tell letters of equal value apart (A and J are both 1)', () => {
    // 49 CFR 565 transliteration: A = J = 1, so swapping them keeps the check digit
    expect(vinCheckDigit('1M8GDM9AXKP042788')).toBe(vinCheckDigit('1M8GDM9JXKP042788'))
  })

  it('gives X for a remainder of 10 and ignores position 9 itself', () => {
    // 49 CFR 565: remainder 10 is written X; position 9 carries weight 0
    expect(vinCheckDigit('1M8GDM9A0KP042788')).toBe('X')
    expect(vinCheckDigit('1M8GDM9A7KP042788')).toBe('X')
  })
})

describe('vinFromScan', () => {
  // What door-jamb and windshield labels hold (49 CFR 565: 17 characters); invented VINs from OUR_VINS.
  it.each([
    ['1WSTR42HXRA100001', '1WSTR42HXRA100001'],
    ['  1wstr42hxra100001\n', '1WSTR42HXRA100001'],
    ['I1WSTR42HXRA100001', '1WSTR42HXRA100001'], // leading import "I" on a Code 39 label (from memory)
    ['VIN: 2WYDE5JK2SB204517', '2WYDE5JK2SB204517'],
    ['VIN2WYDE5JK2SB204517', '2WYDE5JK2SB204517'],
    ['3WXCN8-LM3TC-300288', '3WXCN8LM3TC300288'],
  ])('%j holds %s', (text, vin) => {
    expect(vinFromScan(text)).toBe(vin)
  })
  it.each(['4WAYS1DE5VD41993', 'PN 4471-220-19', '', 'A'.repeat(30)])('%j holds no VIN', (text) => {
    expect(vinFromScan(text)).toBeNull()
  })
})
