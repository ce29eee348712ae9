import { randomUUID } from 'node:crypto'
import { describe, expect, it } from 'vitest'
import { opSchema } from '#shared/schemas/sync'
import {
  checkOp, RECORD_COLLECTIONS, RECORD_ENTITY_NAMES, summarizeOp, SYNC_ENTITIES, SYNC_ENTITY_NAMES,
} from '#shared/sync/entities'
import * as schema from '~~/server/db/schema'

// The registry is Wayside's own protocol (DESIGN.md, "Sync protocol"): these checks hold it to the
// smallest create shapes DESIGN.md promises and to the server's tables, not to figures elsewhere.
const callId = randomUUID()
const create = (entity: string, changes: Record<string, unknown>) => checkOp({ entity, action: 'create', entityId: randomUUID(), changes })
const update = (entity: string, changes: Record<string, unknown>) => checkOp({ entity, action: 'update', entityId: randomUUID(), changes })

describe('the entity registry', () => {
  it('names every entity the op envelope takes, and nothing else', () => {
    expect(opSchema.shape.entity.options).toEqual(SYNC_ENTITY_NAMES)
    // DESIGN.md's list, the mechanic's request for the fleet's approval and the driver's signed estimate added with the estimate.
    const design = ['call', 'reading', 'faultCode', 'note', 'photo', 'clockEvent', 'partLine', 'testRun', 'signOff', 'conflictResolution',
      'approvalRequest', 'estimateSignature']
    expect([...SYNC_ENTITY_NAMES].sort()).toEqual(design.sort())
  })

  it('gives each record a table named like its collection, with the record columns', () => {
    for (const name of RECORD_ENTITY_NAMES) {
      const table = (schema as Record<string, unknown>)[RECORD_COLLECTIONS[name]] as Record<string, unknown> | undefined
      expect(table, `${name} → ${RECORD_COLLECTIONS[name]}`).toBeDefined()
      for (const column of ['id', 'callId', 'createdBy', 'deviceAt', 'version', 'changeXid']) {
        expect(table, `${name}.${column}`).toHaveProperty(column)
      }
    }
  })

  it('makes append-only exactly the records with no updatable fields', () => {
    for (const name of RECORD_ENTITY_NAMES) {
      const def = SYNC_ENTITIES[name]
      expect(def.appendOnly, name).toBe(def.updatable.length === 0)
    }
    expect(SYNC_ENTITIES.faultCode.updatable).toEqual(['state', 'count', 'clearedAt', 'note'])
    expect(SYNC_ENTITIES.note.appendOnly).toBe(true)
  })

  it('puts test runs before readings, which may point at a run sent in the same push', () => {
    expect(RECORD_ENTITY_NAMES.indexOf('testRun')).toBeLessThan(RECORD_ENTITY_NAMES.indexOf('reading'))
  })
})

describe('checkOp: the device before queueing, the server on arrival', () => {
  it('accepts the smallest create shapes of DESIGN.md', () => {
    const reading = { callId, label: 'Sensor resistance', quantity: 'resistance', value: 138.5, unit: 'ohm' }
    expect(create('reading', reading)).toMatchObject({ ok: true, kind: 'create' })
    expect(create('note', { callId, text: 'Cones out' })).toMatchObject({ ok: true })
    expect(create('clockEvent', { callId, kind: 'arrive' })).toMatchObject({ ok: true })
    expect(create('faultCode', { callId, code: 'p0118' })).toMatchObject({ ok: true, data: { code: 'P0118', state: 'active', count: 1 } })
    expect(create('faultCode', { callId, spn: 110, fmi: 3 })).toMatchObject({ ok: true, data: { spn: 110, fmi: 3 } })
  })

  it('names the field of a bad create, and keys a strict update does not know', () => {
    const reading = { callId, label: 'x', quantity: 'resistance', value: 'twelve', unit: 'ohm' }
    expect(create('reading', reading)).toMatchObject({ ok: false, reason: expect.stringMatching(/^value: /) })
    const unknown = update('call', { storyCause: 'x', invoiceTotal: 5 })
    expect(unknown).toEqual({ ok: false, reason: 'invoiceTotal: not a field of a call a device may change' })
    expect(update('faultCode', {})).toEqual({ ok: false, reason: 'changes: nothing to change' })
  })

  it('refuses updates of append-only records, calls made by sync, and an id that is not the op\'s', () => {
    expect(update('note', { text: 'edited' })).toEqual({ ok: false, reason: 'action: notes are append-only' })
    expect(create('call', { complaint: 'x' })).toMatchObject({ ok: false, reason: expect.stringMatching(/^action: calls are taken by dispatch/) })
    expect(create('note', { callId, text: 'x', id: randomUUID() })).toEqual({ ok: false, reason: 'id: differs from the op entityId' })
    expect(create('invoice', {})).toMatchObject({ ok: false, reason: expect.stringMatching(/^entity: /) })
  })

  it('checks a conflict settlement and says whether a value came with it', () => {
    const conflictId = randomUUID()
    const settled = create('conflictResolution', { conflictId, choice: 'value', value: null })
    expect(settled).toMatchObject({ ok: true, kind: 'command', hasValue: true })
    expect(create('conflictResolution', { conflictId, choice: 'value' })).toEqual({ ok: false, reason: 'value: Give the value to keep' })
  })
})

describe('summaries in plain words', () => {
  it('says what each op does', () => {
    const reading = { label: 'Battery', value: 12.6, unit: 'V' }
    expect(summarizeOp({ entity: 'reading', action: 'create', changes: reading })).toBe('Reading: Battery 12.6 V')
    expect(summarizeOp({ entity: 'clockEvent', action: 'create', changes: { kind: 'work_start' } })).toBe('Work started')
    expect(summarizeOp({ entity: 'faultCode', action: 'create', changes: { spn: 110, fmi: 3 } })).toBe('Fault code SPN 110 FMI 3')
    const call = { storyCause: 'x', status: 'on_site' }
    expect(summarizeOp({ entity: 'call', action: 'update', changes: call })).toBe('Call changed: cause, status')
    expect(summarizeOp({ entity: 'conflictResolution', action: 'create', changes: {} })).toBe('Conflict settled')
  })
})
