import { describe, expect, it } from 'vitest'
import { cardDefinitionSchema } from '../../shared/schemas/testCards'
import { OL_OHMS, currentStep, readingText, recordAnswer, recordReading, runReadingRecords, runRecord, specPreview, startRun, targetText, undoLast } from '../../shared/utils/cardRun'
import { SEED_CARDS } from '../../server/db/seed/cards'

const def = (slug: string) => cardDefinitionSchema.parse(SEED_CARDS.find(c => c.slug === slug)!.definition)
const at = '2026-03-01T10:00:00.000Z'
const egtRun = () => startRun({ id: 'run-1', callId: 'call-5', card: { id: 'card-egt', version: 1, definition: def('egt-rtd-sensor') }, ambientC: 12, at })

describe('running the exhaust-temperature card', () => {
  it('needs the ambient temperature, since its spec is computed', () => {
    // our own rule: computed specs need the ambient the mechanic enters
    expect(() => startRun({ id: 'r', callId: 'c', card: { id: 'x', version: 1, definition: def('egt-rtd-sensor') }, at })).toThrow(/ambient/i)
    // a card with only fixed specs starts without one
    expect(startRun({ id: 'r', callId: 'c', card: { id: 'x', version: 1, definition: def('def-concentration') }, at }).ambientC).toBeUndefined()
  })

  it('shows the spec before measuring', () => {
    // IEC 60751 scaled: a Pt200 at 12 °C is 209.36 Ω
    const run = egtRun()
    expect(specPreview(run, currentStep(run)!, 'ohm')).toBe('A Pt200 at 12 °C should read 209.4 Ω ± 2 %')
  })

  it('a low sensor, then a good new part, ends at "Replace sensor" with the readings side by side', () => {
    // IEC 60751 scaled: Pt200 at 12 °C 209.36 Ω ± 2 % = 205.18–213.55 Ω; 118 Ω is low, 210 Ω passes
    let run = egtRun()
    run = recordReading(run, { value: 118, unit: 'ohm', readingId: 'rd-1', at })
    expect(run.results[0]).toMatchObject({ verdict: 'low', next: 'new-sensor-ohms', explanation: 'measured 118 Ω; a Pt200 at 12 °C should read 209.4 Ω ± 2 %; low' })
    expect(currentStep(run)?.partRole).toBe('new')
    // kΩ typed, Ω judged (SI prefix k = 10³)
    run = recordReading(run, { value: 0.21, unit: 'kohm', readingId: 'rd-2', at })
    expect(run.results[1]?.value).toBe(210)
    expect(run.results[1]?.verdict).toBe('pass')
    expect(run.currentStepId).toBeNull()
    expect(run.conclusionId).toBe('replace-sensor')
    expect(targetText(run, 'replace-sensor')).toEqual({ kind: 'conclusion', text: 'Replace sensor' })

    const rec = runRecord(run)
    expect(rec).toMatchObject({ id: 'run-1', callId: 'call-5', cardId: 'card-egt', cardVersion: 1, ambientC: 12, conclusion: 'Replace sensor' })
    expect((rec.steps as unknown[]).length).toBe(2)
    const readings = runReadingRecords(run)
    expect(readings.map(r => [r.id, r.testRunId, r.partRole, r.value, r.unit, r.verdict, r.conditions])).toEqual([
      ['rd-1', 'run-1', 'installed', 118, 'ohm', 'low', 'key_off'],
      ['rd-2', 'run-1', 'new', 210, 'ohm', 'pass', 'key_off'],
    ])
    expect(readings[0]?.spec).toMatchObject({ tolerancePct: 2, text: '209.4 Ω ± 2 %' })
    expect(Math.abs((readings[0]?.spec as { nominal: number }).nominal - 209.3633)).toBeLessThan(1e-4)
  })

  it('a good sensor goes on to the circuit checks; an open signal wire ends at "repair wiring"', () => {
    // IEC 60751 scaled (Pt200, 12 °C); REFERENCES §7: 5 V reference 4.8–5.2 V; common practice: ground ≤ 5 Ω, wire ≤ 1 Ω
    let run = egtRun()
    run = recordReading(run, { value: 209, unit: 'ohm', readingId: 'a', at })
    expect(run.currentStepId).toBe('ref-volts')
    run = recordReading(run, { value: 4990, unit: 'mV', readingId: 'b', at })
    expect(run.currentStepId).toBe('ground-ohms')
    run = recordReading(run, { value: 0.4, unit: 'ohm', readingId: 'c', at })
    run = recordReading(run, { value: 'OL', unit: 'ohm', readingId: 'd', at })
    expect(run.results[3]).toMatchObject({ verdict: 'high', explanation: 'measured OL (open); spec ≤ 1 Ω; high' })
    expect(run.conclusionId).toBe('repair-wiring')
    // JSON has no Infinity: OL is stored as OL_OHMS and shown as OL again
    const d = runReadingRecords(run).find(r => r.id === 'd')!
    expect(d.value).toBe(OL_OHMS)
    expect(JSON.parse(JSON.stringify(runRecord(run))).steps[3].value).toBe(OL_OHMS)
    expect(readingText(d.value as number, 'ohm')).toBe('OL (open)')
  })

  it('measure again takes back the last step until the run is saved', () => {
    // our own rule
    let run = recordReading(egtRun(), { value: 118, unit: 'ohm', readingId: 'a', at })
    run = undoLast(run)
    expect(run.results).toEqual([])
    expect(run.currentStepId).toBe('sensor-ohms')
    run = recordReading(recordReading(run, { value: 118, unit: 'ohm', readingId: 'a', at }), { value: 210, unit: 'ohm', readingId: 'b', at })
    expect(undoLast(run).conclusionId).toBeUndefined()
    expect(() => undoLast({ ...run, saved: { run: true, readings: [] } })).toThrow(/saved/)
  })

  it('refuses readings that make no sense for the step', () => {
    // our own input contract
    const run = egtRun()
    expect(() => recordReading(run, { value: 5, unit: 'V', readingId: 'a', at })).toThrow(/does not measure/)
    expect(() => recordReading(run, { value: -5, unit: 'ohm', readingId: 'a', at })).toThrow(/negative/)
    expect(() => recordReading(run, { value: Number.NaN, unit: 'ohm', readingId: 'a', at })).toThrow(RangeError)
    expect(() => recordAnswer(run, { answer: 'yes', at })).toThrow(/reading/)
    expect(() => runRecord(run)).toThrow(/conclusion/)
  })
})

describe('answer steps', () => {
  it('the DEF card: cloudy sample ends at contaminated; clear and 32.5 % ends at within spec', () => {
    // ISO 22241-1 (REFERENCES §8): 31.8–33.2 %
    const start = () => startRun({ id: 'r', callId: 'c', card: { id: 'x', version: 3, definition: def('def-concentration') }, at })
    expect(recordAnswer(start(), { answer: 'no', at }).conclusionId).toBe('contaminated')
    let run = recordAnswer(start(), { answer: 'yes', at })
    run = recordReading(run, { value: 32.5, unit: 'pct', readingId: 'p', at })
    expect(run.conclusionId).toBe('def-ok')
    expect(runRecord(run).cardVersion).toBe(3)
    // only measured steps make readings
    expect(runReadingRecords(run).map(r => r.quantity)).toEqual(['concentration'])
    // REFERENCES §8: 33.9 % is above the 33.2 % limit and takes the card's high way
    expect(recordReading(recordAnswer(start(), { answer: 'yes', at }), { value: 33.9, unit: 'pct', readingId: 'p', at }).conclusionId).toBe('too-strong')
  })
})
