import { describe, expect, it } from 'vitest'
import { codeMatchesPattern, faultCodeKey, isReturnedFaultCode, parseCodePattern, returnedFaultCodes, suggestCards } from '../../shared/utils/faultMatch'

describe('code patterns', () => {
  it('reads the pattern forms a card may list', () => {
    // our own card format over SAE J2012 codes and J1939 SPN/FMI pairs
    expect(parseCodePattern('P0544')).toEqual({ form: 'j2012', prefix: 'P0544', exact: true })
    expect(parseCodePattern('p20*')).toEqual({ form: 'j2012', prefix: 'P20', exact: false })
    expect(parseCodePattern('SPN 3242')).toEqual({ form: 'j1939', spn: 3242, fmi: null })
    expect(parseCodePattern('SPN 173 FMI *')).toEqual({ form: 'j1939', spn: 173, fmi: null })
    expect(parseCodePattern(' spn 110 fmi 3 ')).toEqual({ form: 'j1939', spn: 110, fmi: 3 })
  })

  it.each([
    ['P054', /5 characters/],
    ['X0544', /not a code pattern/],
    ['P4544', /not a code pattern/],
    ['SPN 600000', /0–524287/],
    ['SPN 110 FMI 32', /0–31/],
    ['SPN', /not a code pattern/],
    ['', /not a code pattern/],
  ])('refuses %j naming the problem', (bad, msg) => {
    // SAE J2012 structure (letter PCBU, digit 0–3, hex); SAE J1939: SPN 19 bits, FMI 5 bits
    expect(() => parseCodePattern(bad)).toThrow(msg)
  })

  it('matches codes', () => {
    // our own card format: exact code, J2012 prefix, SPN with any FMI, one SPN/FMI pair
    expect(codeMatchesPattern('P0544', { code: 'p0544' })).toBe(true)
    expect(codeMatchesPattern('P0544', { code: 'P0545' })).toBe(false)
    expect(codeMatchesPattern('P20*', { code: 'P2031' })).toBe(true)
    expect(codeMatchesPattern('P20*', { code: 'P0200' })).toBe(false)
    expect(codeMatchesPattern('SPN 3242', { spn: 3242, fmi: 4 })).toBe(true)
    expect(codeMatchesPattern('SPN 173 FMI *', { spn: 173, fmi: 0 })).toBe(true)
    expect(codeMatchesPattern('SPN 110 FMI 3', { spn: 110, fmi: 4 })).toBe(false)
    expect(codeMatchesPattern('SPN 110 FMI 3', { spn: 110, fmi: 3 })).toBe(true)
    // a J1939 pattern never matches a J2012 code and the reverse
    expect(codeMatchesPattern('SPN 110', { code: 'P0110' })).toBe(false)
    expect(codeMatchesPattern('P0*', { spn: 110, fmi: 3 })).toBe(false)
    expect(() => codeMatchesPattern('P0544', { code: 'PO544' })).toThrow(RangeError)
    expect(() => codeMatchesPattern('P0544', {})).toThrow(/SPN and FMI/)
  })

  it('suggests the cards that fit the call’s codes, best fit first', () => {
    // our own ranking: more codes matched, then exact over SPN-only over prefix
    const cards = [
      { id: 'generic', codePatterns: ['P0*'] },
      { id: 'egt', codePatterns: ['SPN 3242 FMI *', 'P0544'] },
      { id: 'ect', codePatterns: ['SPN 110', 'P0117', 'P0118'] },
      { id: 'bad', codePatterns: ['nonsense'] },
    ]
    const s = suggestCards(cards, [{ spn: 3242, fmi: 4 }, { code: 'P0117' }, { code: 'garbage' }])
    expect(s.map(x => x.card.id)).toEqual(['ect', 'egt', 'generic'])
    expect(s[0]?.matches).toEqual(['P0117'])
    expect(s[1]?.matches).toEqual(['SPN 3242 FMI 4'])
    expect(suggestCards(cards, [])).toEqual([])
  })

  it('labels codes', () => {
    // SAE J2012 normal form; J1939 SPN/FMI pair
    expect(faultCodeKey({ code: ' p0118' })).toBe('P0118')
    expect(faultCodeKey({ spn: 110, fmi: 0 })).toBe('SPN 110 FMI 0')
  })
})

describe('the returned-code rule', () => {
  // One unit's history: SPN 3242 FMI 4 cleared after a repair on call A, seen again on call B.
  const cleared = { id: 'f1', callId: 'A', spn: 3242, fmi: 4, seenAt: '2026-03-01T10:00:00Z', clearedAt: '2026-03-01T12:00:00Z' }
  const again = { id: 'f2', callId: 'B', spn: 3242, fmi: 4, seenAt: '2026-03-20T08:00:00Z' }
  const otherFmi = { id: 'f3', callId: 'B', spn: 3242, fmi: 3, seenAt: '2026-03-20T08:00:00Z' }
  const p0117 = { id: 'f4', callId: 'B', code: 'P0117', seenAt: '2026-03-20T08:00:00Z' }

  it('flags the same code seen after it was cleared', () => {
    // our own rule: same code (J2012) or same SPN and FMI, seen after a clearing
    const r = returnedFaultCodes([cleared, again, otherFmi, p0117])
    expect([...r.keys()]).toEqual(['f2'])
    expect(r.get('f2')?.id).toBe('f1')
    expect(isReturnedFaultCode(again, [cleared])).toBe(true)
  })

  it('a code cleared and not seen again, or never cleared, has not returned', () => {
    // our own rule
    expect(returnedFaultCodes([cleared]).size).toBe(0)
    const neverCleared = { ...cleared, clearedAt: null }
    expect(returnedFaultCodes([neverCleared, again]).size).toBe(0)
    // seen before the clearing: the same fault, not a return
    expect(isReturnedFaultCode({ ...again, seenAt: '2026-03-01T11:00:00Z' }, [cleared])).toBe(false)
  })

  it('a return on the same call counts (the code came back at the verify drive)', () => {
    // our own rule
    const sameCall = { id: 'f5', callId: 'A', spn: 3242, fmi: 4, seenAt: '2026-03-01T12:30:00Z' }
    expect(isReturnedFaultCode(sameCall, [cleared])).toBe(true)
  })

  it('reports the latest clearing it came back after', () => {
    // our own rule
    const second = { id: 'f6', callId: 'C', spn: 3242, fmi: 4, seenAt: '2026-03-10T08:00:00Z', clearedAt: '2026-03-10T09:00:00Z' }
    expect(returnedFaultCodes([cleared, second, again]).get('f2')?.id).toBe('f6')
  })

  it('rejects bad dates and entries', () => {
    // our own input contract
    expect(() => returnedFaultCodes([{ ...cleared, seenAt: 'yesterday' }])).toThrow(/seenAt/)
    expect(() => returnedFaultCodes([{ ...cleared, id: undefined as never }])).toThrow(/id/)
    expect(() => returnedFaultCodes('x' as never)).toThrow(/list/)
  })
})
