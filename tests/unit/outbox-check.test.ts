// The device checks each op against the protocol's schema before it is queued: what the server
// would refuse for its shape is refused on the phone, beside the field, and nothing is written.
import { beforeEach, describe, expect, it } from 'vitest'
import { useFieldStore } from '../../app/stores/field'
import { readBundle, readOutbox } from '../../app/utils/deviceRead'
import { OpRefusedError } from '../../app/utils/opCheck'
import { SIGNATURE_MAX_CHARS } from '../../shared/schemas/sync'
import { CALL_ID, freshDevice, seedCall } from './outbox-support'

beforeEach(async () => { await freshDevice(); await seedCall() })

async function refused(write: Promise<unknown>) {
  const err = await write.then(() => undefined, (e: unknown) => e)
  expect(err).toBeInstanceOf(OpRefusedError)
  return (err as OpRefusedError).fields
}

describe('ops checked before they are queued', () => {
  it('refuses a signature larger than the server takes, and queues nothing', async () => {
    const signature = `data:image/png;base64,${'A'.repeat(SIGNATURE_MAX_CHARS)}`
    const fields = await refused(useFieldStore().addRecord('signOff', { callId: CALL_ID, driverName: 'K. Okafor', signature }))
    expect(fields).toEqual({ signature: 'The signature image is too large' })
    expect(await readOutbox()).toEqual([])
    expect((await readBundle(CALL_ID))?.records.signOffs).toEqual({})
  })

  it('refuses a part price the server would refuse', async () => {
    const part = { callId: CALL_ID, partNumber: 'TR-DEF-10', description: 'DEF jug', quantity: 1, unitPriceCents: 1_000_000_000 }
    expect(await refused(useFieldStore().addRecord('partLine', part))).toEqual({ unitPriceCents: 'At most 100000000' })
    expect(await readOutbox()).toEqual([])
  })

  it('refuses a call field the device may not send and a status that does not exist', async () => {
    const field = useFieldStore()
    // The refusal names the field the phone may not send, beside which a form would show it.
    expect(await refused(field.updateCall(CALL_ID, { invoiceNumber: 'X' }))).toEqual({ invoiceNumber: 'Not a field this takes' })
    expect(await refused(field.updateCall(CALL_ID, { status: 'parked' }))).toEqual({ status: 'Unknown status' })
    expect(await readOutbox()).toEqual([])
    expect((await readBundle(CALL_ID))?.call.status).toBe('assigned')
  })

  it('refuses the whole change when one of its ops is bad (a status step and its clock event)', async () => {
    const write = useFieldStore().writeCall(CALL_ID, { status: 'en_route' }, [{ entity: 'clockEvent', record: { kind: 'lunch' } }])
    expect(Object.keys(await refused(write))).toEqual(['kind'])
    expect(await readOutbox()).toEqual([])
    expect((await readBundle(CALL_ID))?.call.status).toBe('assigned')
  })

  it('queues what the server will read: a typed code in its normal form', async () => {
    const id = await useFieldStore().addRecord('faultCode', { callId: CALL_ID, code: ' p0118 ', state: 'active', count: 1 })
    const [op] = await readOutbox()
    expect(op?.changes).toEqual({ callId: CALL_ID, code: 'P0118', state: 'active', count: 1 })
    expect((await readBundle(CALL_ID))?.records.faultCodes[id]?.code).toBe('P0118')
  })
})
