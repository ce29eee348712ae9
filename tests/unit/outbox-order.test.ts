import { beforeEach, describe, expect, it } from 'vitest'
import { useFieldStore } from '../../app/stores/field'
import { useOutboxStore } from '../../app/stores/outbox'
import { getClientId } from '../../app/utils/fieldDb'
import { readBundle, readOutbox } from '../../app/utils/deviceRead'
import { CALL_ID, freshDevice, reloadApp, seedCall } from './outbox-support'

beforeEach(async () => { await freshDevice(); await seedCall() })

describe('outbox: order, seq and persistence', () => {
  it('writes each record with its op and keeps them in the order written', async () => {
    const field = useFieldStore()
    const a = await field.addRecord('note', { callId: CALL_ID, text: 'Parked on the shoulder, hazards on' })
    const b = await field.addRecord('reading', { callId: CALL_ID, label: 'Battery', quantity: 'voltage', value: 12.6, unit: 'V' })
    await field.updateCall(CALL_ID, { status: 'en_route' })
    const c = await field.addRecord('faultCode', { callId: CALL_ID, spn: 110, fmi: 0, state: 'active', count: 1 })
    const ops = await readOutbox()
    expect(ops.map(o => [o.entity, o.entityId])).toEqual([['note', a], ['reading', b], ['call', CALL_ID], ['faultCode', c]])
    expect(ops.map(o => o.action)).toEqual(['create', 'create', 'update', 'create'])
    // The update carries what the phone last saw: the server version and the old value.
    expect(ops[2]).toMatchObject({ baseVersion: 3, base: { status: 'assigned' }, changes: { status: 'en_route' } })
    expect(ops[1]!.changes).toEqual({ callId: CALL_ID, label: 'Battery', quantity: 'voltage', value: 12.6, unit: 'V' })
    const bundle = await readBundle(CALL_ID)
    expect(bundle?.call.status).toBe('en_route')
    expect(bundle?.records.notes[a]?.text).toBe('Parked on the shoulder, hazards on')
  })

  it('numbers seq 1, 2, 3 … without gaps, one client id for the device, also across a reload', async () => {
    const field = useFieldStore()
    for (let i = 0; i < 5; i++) await field.addRecord('note', { callId: CALL_ID, text: `note ${i}` })
    await reloadApp()
    const again = useFieldStore()
    // Written together from two screens at once: each still gets its own seq.
    await Promise.all([1, 2, 3].map(i => again.addRecord('clockEvent', { callId: CALL_ID, kind: i === 1 ? 'work_start' : 'work_stop' })))
    const ops = await readOutbox()
    expect(ops.map(o => o.seq)).toEqual([1, 2, 3, 4, 5, 6, 7, 8])
    const clientId = await getClientId()
    expect(new Set(ops.map(o => o.clientId))).toEqual(new Set([clientId]))
    expect(new Set(ops.map(o => o.opId)).size).toBe(8)
  })

  it('keeps the outbox and the records across a reload of the stores', async () => {
    const field = useFieldStore()
    const id = await field.addRecord('note', { callId: CALL_ID, text: 'kept' })
    await field.updateCall(CALL_ID, { storyCause: 'Chafed harness at the frame rail' })
    await reloadApp()
    const outbox = useOutboxStore()
    expect(outbox.entries).toEqual([]) // a new store knows nothing until it reads
    await outbox.refresh()
    expect(outbox.entries.map(e => e.entityId)).toEqual([id, CALL_ID])
    expect(outbox.waitingCount).toBe(2)
    const view = await useFieldStore().loadCall(CALL_ID)
    expect(view?.notes.map(n => n.text)).toEqual(['kept'])
    expect(view?.call.storyCause).toBe('Chafed harness at the frame rail')
    expect(view?.pendingIds.sort()).toEqual([id, CALL_ID].sort())
    expect(view?.unit?.unitNumber).toBe('IR-114')
  })

  it('refuses a record for a call that is not on the phone, and writes nothing', async () => {
    const field = useFieldStore()
    await expect(field.addRecord('note', { callId: '99999999-9999-4999-8999-999999999999', text: 'x' })).rejects.toThrow(/not on the phone/)
    expect(await readOutbox()).toEqual([])
  })
})
