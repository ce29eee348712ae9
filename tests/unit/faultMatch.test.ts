import { describe, expect, it } from 'vitest'
import {
  codeMatchesPattern, faultCodeKey, isReturnedFaultCode, parseCodePattern, parseFaultCodeText, patternProblemForKind, returnedFaultCodes,
  suggestCards, suggestTestCards,
} from '../../shared/utils/faultMatch'
import { cardDefinitionSchema } from '../../shared/schemas/testCards'
import { SEED_CARDS } from '../../server/db/seed/cards'

describe('code patterns', () => {
  it('reads the pattern forms a card may list', () => {
    // our own card format over SAE J2012 codes and J1939 SPN/FMI pairs
    expect(parseCodePattern('P0544')).toEqual({ form: 'j2012', prefix: 'P0544', exact: true })
    expect(parseCodePattern('p20*')).toEqual({ form: 'j2012', prefix: 'P20', exact: false })
    expect(parseCodePattern('SPN 3242')).toEqual({ form: 'j1939', spn: 3242, fmi: null, kind: null })
    expect(parseCodePattern('SPN 173 FMI *')).toEqual({ form: 'j1939', spn: 173, fmi: null, kind: null })
    expect(parseCodePattern(' spn 110 fmi 3 ')).toEqual({ form: 'j1939', spn: 110, fmi: 3, kind: null })
    expect(parseCodePattern('SPN 3242 FMI circuit')).toEqual({ form: 'j1939', spn: 3242, fmi: null, kind: 'circuit' })
    expect(parseCodePattern('p2080-p2084')).toEqual({ form: 'j2012_range', from: 'P2080', to: 'P2084' })
    expect(parseCodePattern('P242A–P242E')).toEqual({ form: 'j2012_range', from: 'P242A', to: 'P242E' })
  })

  it.each([
    ['P054', /5 characters/],
    ['X0544', /not a code pattern/],
    ['P4544', /not a code pattern/],
    ['SPN 600000', /0–524287/],
    ['SPN 110 FMI 32', /0–31/],
    ['SPN', /not a code pattern/],
    ['', /not a code pattern/],
    ['SPN 3242 FMI hot', /a kind \(condition, circuit/],
    ['P2084-P2080', /backwards/],
    ['P0544-P2033', /same two characters/],
    ['P054-P0549', /not a code pattern/],
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
    // FMI kinds (SAE J1939-73 as grouped by fmiKind): 3–6 circuit, 2 signal, 0 data valid
    expect(codeMatchesPattern('SPN 3242 FMI circuit', { spn: 3242, fmi: 4 })).toBe(true)
    expect(codeMatchesPattern('SPN 3242 FMI circuit', { spn: 3242, fmi: 2 })).toBe(false)
    expect(codeMatchesPattern('SPN 3242 FMI signal', { spn: 3242, fmi: 2 })).toBe(true)
    expect(codeMatchesPattern('SPN 3242 FMI circuit', { spn: 3242, fmi: 0 })).toBe(false)
    expect(codeMatchesPattern('SPN 3242 FMI condition', { spn: 3242, fmi: 0 })).toBe(true)
    // J2012 ranges compare the last three characters as hexadecimal, ends included
    expect(codeMatchesPattern('P2080-P2084', { code: 'P2080' })).toBe(true)
    expect(codeMatchesPattern('P2080-P2084', { code: 'P2084' })).toBe(true)
    expect(codeMatchesPattern('P2080-P2084', { code: 'P2085' })).toBe(false)
    expect(codeMatchesPattern('P242A-P242E', { code: 'P242C' })).toBe(true)
    expect(codeMatchesPattern('P242A-P242E', { code: 'P2429' })).toBe(false)
    expect(codeMatchesPattern('P2080-P2084', { code: 'C2081' })).toBe(false)
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

  it('a card’s kind holds even against a pattern that takes every FMI', () => {
    // our own rule: sensor-circuit cards fit circuit and signal FMIs, condition cards data-valid ones (SAE J1939-73 groups)
    const loose = [
      { id: 'circuit', kind: 'sensor_circuit' as const, codePatterns: ['SPN 3242 FMI *'] },
      { id: 'hot', kind: 'condition' as const, codePatterns: ['SPN 3242'] },
    ]
    expect(suggestCards(loose, [{ spn: 3242, fmi: 0 }]).map(s => s.card.id)).toEqual(['hot'])
    expect(suggestCards(loose, [{ spn: 3242, fmi: 3 }]).map(s => s.card.id)).toEqual(['circuit'])
    // a J2012 code carries no FMI: the pattern alone decides
    expect(suggestCards([{ id: 'x', kind: 'condition' as const, codePatterns: ['P2428-P2429'] }], [{ code: 'P2428' }]).length).toBe(1)
  })

  it('names a pattern a card of its kind may not list', () => {
    // our own rule, over the FMI kinds of SAE J1939-73
    expect(patternProblemForKind('SPN 3242 FMI *', 'sensor_circuit')).toMatch(/takes every FMI.*SPN 3242 FMI circuit and SPN 3242 FMI signal/)
    expect(patternProblemForKind('SPN 3242 FMI 0', 'sensor_circuit')).toMatch(/is a condition FMI/)
    expect(patternProblemForKind('SPN 3242 FMI 4', 'sensor_circuit')).toBeNull()
    expect(patternProblemForKind('SPN 110 FMI circuit', 'condition')).toMatch(/circuit FMI/)
    expect(patternProblemForKind('SPN 110 FMI 16', 'condition')).toBeNull()
    expect(patternProblemForKind('SPN 110', 'system')).toBeNull()
    expect(patternProblemForKind('P0118', 'sensor_circuit')).toBeNull()
  })

  it('reads fault codes as typed, naming the one it cannot read', () => {
    // SAE J2012 form; J1939 SPN 0–524287, FMI 0–31
    expect(parseFaultCodeText(' p0545 ')).toEqual({ code: 'P0545' })
    expect(parseFaultCodeText('SPN 3242 FMI 4')).toEqual({ spn: 3242, fmi: 4 })
    expect(parseFaultCodeText('spn3242fmi4')).toEqual({ spn: 3242, fmi: 4 })
    expect(() => parseFaultCodeText('PO545')).toThrow(/PO545.*letter O/)
    expect(() => parseFaultCodeText('SPN 3242 FMI 40')).toThrow(/FMI must be 0–31/)
    expect(() => parseFaultCodeText('SPN 3242')).toThrow(/SPN 3242 FMI 4/)
    expect(() => parseFaultCodeText('')).toThrow(/Empty/)
  })
})

describe('the seeded library: how the code failed picks the card', () => {
  const library = SEED_CARDS.map(c => ({ slug: c.slug, definition: cardDefinitionSchema.parse(c.definition) }))
  const slugs = (faults: Parameters<typeof suggestTestCards>[1]) => suggestTestCards(library, faults).map(s => s.card.slug)

  it('the same exhaust SPN: a circuit FMI leads to the sensor card, a data-valid FMI to the over-temperature card', () => {
    // SAE J1939-73: FMI 4 voltage below normal (circuit); FMI 0 data valid but above normal range (condition)
    expect(slugs([{ spn: 3242, fmi: 4 }])).toEqual(['egt-rtd-sensor'])
    expect(slugs([{ spn: 3242, fmi: 0 }])).toEqual(['aftertreatment-overtemp'])
    expect(slugs([{ spn: 3242, fmi: 16 }])).toEqual(['aftertreatment-overtemp'])
  })

  it('the same coolant SPN: circuit-high to the sensor card, data-valid high to the engine over-temperature card', () => {
    // SAE J1939-73: FMI 3 voltage above normal (an open NTC); FMI 0 / 16 data valid, above normal
    expect(slugs([{ spn: 110, fmi: 3 }])).toEqual(['coolant-temp-ntc'])
    expect(slugs([{ spn: 110, fmi: 0 }])).toEqual(['engine-overtemp'])
    expect(slugs([{ spn: 110, fmi: 16 }])).toEqual(['engine-overtemp'])
  })

  it('J2012 families by range', () => {
    // SAE J2012 code families as the python-OBD and OBDIICodes lists title them (REFERENCES.md §4): P0545 EGT circuit low,
    // P2031–P2036 EGT sensor 2 circuits, P2080–P2087 EGT range/performance; P0118 coolant temperature circuit high;
    // P2428 exhaust gas temperature too high (from memory)
    expect(slugs([{ code: 'P0545' }])).toEqual(['egt-rtd-sensor'])
    expect(slugs([{ code: 'P2033' }])).toEqual(['egt-rtd-sensor'])
    expect(slugs([{ code: 'P2087' }])).toEqual(['egt-rtd-sensor'])
    expect(slugs([{ code: 'P2428' }])).toEqual(['aftertreatment-overtemp'])
    expect(slugs([{ code: 'P0118' }])).toEqual(['coolant-temp-ntc'])
  })
})

describe('code labels', () => {
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
