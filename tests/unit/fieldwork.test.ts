import { describe, expect, it } from 'vitest'
import {
  faultCodeInputSchema, noteInputSchema, partLineInputSchema, readingInputSchema, signOffInputSchema, verificationInputSchema,
} from '../../shared/schemas/fieldwork'
import { SIGNATURE_MAX_CHARS } from '../../shared/schemas/sync'
import { SYNC_ENTITIES } from '../../shared/sync/entities'
import { fieldErrorsOf } from '../../shared/utils/fieldErrors'

const CALL = '11111111-1111-4111-8111-111111111111'
const PNG = 'data:image/png;base64,iVBORw0KGgo='

const blankSpec = { min: '', max: '', nominal: '', tolerance: '', tolerancePct: '' }

describe('the phone forms', () => {
  it('reads a keypad value with a decimal comma and leaves an empty spec out', () => {
    const r = readingInputSchema.parse({
      label: 'Battery', quantity: 'voltage', value: '12,6', unit: 'V', component: '', pins: '', conditions: '', spec: blankSpec,
    })
    expect(r).toMatchObject({ value: 12.6, unit: 'V', spec: {} })
    expect(r.component).toBeUndefined()
  })

  it('keeps a spec it can judge and names the field of a bad one', () => {
    const ok = readingInputSchema.parse({
      label: 'DEF', quantity: 'concentration', value: '26', unit: '%', spec: { ...blankSpec, min: '31.8', max: '33.2' },
    })
    expect(ok.spec).toEqual({ min: 31.8, max: 33.2 })
    const bad = readingInputSchema.safeParse({
      label: 'DEF', quantity: 'concentration', value: 'abc', unit: '%', spec: { ...blankSpec, min: '40', max: '30' },
    })
    expect(bad.success).toBe(false)
    const fields = fieldErrorsOf(bad.error!)
    expect(fields.value).toBe('Value must be a number')
    expect(fields.spec).toMatch(/cross/)
  })

  it('takes a J2012 code or an SPN/FMI pair, not a malformed one', () => {
    expect(faultCodeInputSchema.parse({ form: 'j2012', code: ' p0118 ', state: 'active', count: '1' }))
      .toEqual({ code: 'P0118', state: 'active', count: 1 })
    expect(faultCodeInputSchema.parse({ form: 'j1939', spn: '110', fmi: '0', state: 'stored', count: '3' }))
      .toEqual({ spn: 110, fmi: 0, state: 'stored', count: 3 })
    const bad = faultCodeInputSchema.safeParse({ form: 'j1939', spn: '600000', fmi: '40', state: 'active', count: '1' })
    expect(Object.keys(fieldErrorsOf(bad.error!)).sort()).toEqual(['fmi', 'spn'])
    expect(faultCodeInputSchema.safeParse({ form: 'j2012', code: 'X123', state: 'active', count: '1' }).success).toBe(false)
  })

  it('turns typed prices into cents and leaves an unknown price at 0', () => {
    expect(partLineInputSchema.parse({ partNumber: 'TR-DEF-10', description: 'DEF jug', quantity: '3', unitPrice: '24.00', corePrice: '' }))
      .toEqual({ partNumber: 'TR-DEF-10', description: 'DEF jug', quantity: 3, unitPriceCents: 2400, coreChargeCents: 0 })
    expect(fieldErrorsOf(partLineInputSchema.safeParse({ partNumber: '', description: 'x', quantity: '0' }).error!))
      .toMatchObject({ partNumber: 'Enter a part number', quantity: 'Must be more than 0' })
  })

  it('wants a drawn signature and a name', () => {
    const f = fieldErrorsOf(signOffInputSchema.safeParse({ driverName: ' ', signature: undefined }).error!)
    expect(f).toMatchObject({ driverName: 'Enter the driver\'s name', signature: 'The driver signs in the box first' })
  })

  it('reads the test drive as distance or time', () => {
    const v = verificationInputSchema.parse({
      codesCleared: true, liveValuesChecked: true, lampsOff: true, derateGone: true, testDriveKm: '8', testDriveMinutes: '',
    })
    expect(v).toMatchObject({ testDriveKm: 8 })
    expect(v.testDriveMinutes).toBeUndefined()
  })

  // The server's own create schemas (the registry, shared/sync/entities.ts) are the outside check here: what a
  // form accepts they accept, and what they would refuse the form refuses before it is queued.
  it('refuses on the phone what the server would refuse at sync', () => {
    const price = partLineInputSchema.safeParse({
      partNumber: 'X-1', description: 'Jug', quantity: '1', unitPrice: '2000000', corePrice: '',
    })
    expect(fieldErrorsOf(price.error!)).toEqual({ unitPrice: 'Unit price must be from 0.00 to 1000000.00' })
    expect(fieldErrorsOf(partLineInputSchema.safeParse({ partNumber: 'X'.repeat(61), description: 'd', quantity: '1' }).error!).partNumber)
      .toBe('At most 60 characters')
    const big = `${PNG}${'A'.repeat(SIGNATURE_MAX_CHARS)}`
    expect(fieldErrorsOf(signOffInputSchema.safeParse({ driverName: 'K. Okafor', signature: big }).error!).signature)
      .toBe('The signature image is too large')
    expect(noteInputSchema.safeParse({ text: 'x'.repeat(10_001) }).success).toBe(false)
    expect(SYNC_ENTITIES.note.create.safeParse({ callId: CALL, text: 'x'.repeat(10_001) }).success).toBe(false)
  })

  it('gives the server a record it accepts for every form', () => {
    const part = partLineInputSchema.parse({
      partNumber: 'TR-DEF-10', description: 'DEF jug', quantity: '2,5', unitPrice: '24,00', corePrice: '',
    })
    expect(SYNC_ENTITIES.partLine.create.safeParse({ callId: CALL, ...part }).success).toBe(true)
    const reading = readingInputSchema.parse({
      label: 'Battery', quantity: 'voltage', value: '12,6', unit: 'V', spec: { min: '12.4', max: '' },
    })
    expect(SYNC_ENTITIES.reading.create.safeParse({ callId: CALL, ...reading }).success).toBe(true)
    const code = faultCodeInputSchema.parse({ form: 'j1939', spn: '3242', fmi: '4', state: 'active', count: '' })
    expect(SYNC_ENTITIES.faultCode.create.safeParse({ callId: CALL, ...code }).success).toBe(true)
    const signed = signOffInputSchema.parse({ driverName: 'K. Okafor', signature: PNG })
    expect(SYNC_ENTITIES.signOff.create.safeParse({ callId: CALL, ...signed }).success).toBe(true)
  })
})
