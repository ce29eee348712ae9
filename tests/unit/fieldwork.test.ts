import { describe, expect, it } from 'vitest'
import { faultCodeInputSchema, partLineInputSchema, readingInputSchema, signOffInputSchema, verificationInputSchema } from '../../shared/schemas/fieldwork'
import { fieldErrorsOf } from '../../shared/utils/fieldErrors'

const blankSpec = { min: '', max: '', nominal: '', tolerance: '', tolerancePct: '' }

describe('the phone forms', () => {
  it('reads a keypad value with a decimal comma and leaves an empty spec out', () => {
    const r = readingInputSchema.parse({ label: 'Battery', quantity: 'voltage', value: '12,6', unit: 'V', component: '', pins: '', conditions: '', spec: blankSpec })
    expect(r).toMatchObject({ value: 12.6, unit: 'V', spec: {} })
    expect(r.component).toBeUndefined()
  })

  it('keeps a spec it can judge and names the field of a bad one', () => {
    const ok = readingInputSchema.parse({ label: 'DEF', quantity: 'concentration', value: '26', unit: '%', spec: { ...blankSpec, min: '31.8', max: '33.2' } })
    expect(ok.spec).toEqual({ min: 31.8, max: 33.2 })
    const bad = readingInputSchema.safeParse({ label: 'DEF', quantity: 'concentration', value: 'abc', unit: '%', spec: { ...blankSpec, min: '40', max: '30' } })
    expect(bad.success).toBe(false)
    const fields = fieldErrorsOf(bad.error!)
    expect(fields.value).toBe('Value must be a number')
    expect(fields.spec).toMatch(/cross/)
  })

  it('takes a J2012 code or an SPN/FMI pair, not a malformed one', () => {
    expect(faultCodeInputSchema.parse({ form: 'j2012', code: ' p0118 ', state: 'active', count: '1' })).toEqual({ code: 'P0118', state: 'active', count: 1 })
    expect(faultCodeInputSchema.parse({ form: 'j1939', spn: '110', fmi: '0', state: 'stored', count: '3' })).toEqual({ spn: 110, fmi: 0, state: 'stored', count: 3 })
    const bad = faultCodeInputSchema.safeParse({ form: 'j1939', spn: '600000', fmi: '40', state: 'active', count: '1' })
    expect(Object.keys(fieldErrorsOf(bad.error!)).sort()).toEqual(['fmi', 'spn'])
    expect(faultCodeInputSchema.safeParse({ form: 'j2012', code: 'X123', state: 'active', count: '1' }).success).toBe(false)
  })

  it('turns typed prices into cents and leaves an unknown price at 0', () => {
    expect(partLineInputSchema.parse({ partNumber: 'TR-DEF-10', description: 'DEF jug', quantity: '3', unitPrice: '24.00', corePrice: '' }))
      .toEqual({ partNumber: 'TR-DEF-10', description: 'DEF jug', quantity: 3, unitPriceCents: 2400, coreChargeCents: 0 })
    expect(fieldErrorsOf(partLineInputSchema.safeParse({ partNumber: '', description: 'x', quantity: '0' }).error!)).toMatchObject({ partNumber: 'Part number is required', quantity: 'Quantity must be above 0' })
  })

  it('wants a drawn signature and a name', () => {
    const f = fieldErrorsOf(signOffInputSchema.safeParse({ driverName: ' ', signature: undefined }).error!)
    expect(f).toMatchObject({ driverName: 'Write the driver\'s name', signature: 'The driver signs in the box first' })
  })

  it('reads the test drive as distance or time', () => {
    const v = verificationInputSchema.parse({ codesCleared: true, liveValuesChecked: true, lampsOff: true, derateGone: true, testDriveKm: '8', testDriveMinutes: '' })
    expect(v).toMatchObject({ testDriveKm: 8 })
    expect(v.testDriveMinutes).toBeUndefined()
  })
})
