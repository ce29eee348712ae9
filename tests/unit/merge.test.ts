import { describe, expect, it } from 'vitest'
import { mergeCallField, sameSyncValue, type MergeInput } from '~~/server/utils/sync/merge'

// The merge rules are Wayside's own protocol (DESIGN.md, "Sync protocol"); the cases below are the
// rules written out, not figures from an outside source.
const base = (over: Partial<MergeInput>): MergeInput => ({
  field: 'storyCause', device: 'Chafed harness at the crossmember', server: null, base: { value: null },
  role: 'mechanic', serverStatus: 'on_site', ...over,
})

describe('three-way merge of one call field', () => {
  it('takes the device value when the server still holds the base', () => {
    expect(mergeCallField(base({}))).toEqual({ action: 'take', value: 'Chafed harness at the crossmember' })
  })

  it('does nothing when the server already holds the device value', () => {
    expect(mergeCallField(base({ server: 'Chafed harness at the crossmember', base: { value: 'old text' } }))).toEqual({ action: 'same' })
  })

  it('raises a conflict naming the field when both sides changed it from the base', () => {
    const d = mergeCallField(base({ server: 'Office wording', base: { value: 'Original wording' } }))
    expect(d.action).toBe('conflict')
    expect(d.action === 'conflict' && d.reason).toMatch(/^storyCause: changed on the server/)
  })

  it('without a base value, trusts baseVersion: equal takes, different conflicts', () => {
    expect(mergeCallField(base({ base: undefined, server: 'x', baseVersionMatches: true })).action).toBe('take')
    expect(mergeCallField(base({ base: undefined, server: 'x', baseVersionMatches: false })).action).toBe('conflict')
  })

  it('compares structured values by content, not key order', () => {
    const checklist = { cones: true, vest: true }
    const d = mergeCallField(base({
      field: 'sceneChecklist', device: { vest: true, cones: true, chocks: true }, server: checklist,
      base: { value: { vest: true, cones: true } },
    }))
    expect(d.action).toBe('take')
    expect(sameSyncValue({ a: 1, b: [1, 2] }, { b: [1, 2], a: 1 })).toBe(true)
    expect(sameSyncValue(new Date('2026-03-01T10:00:00Z'), '2026-03-01T10:00:00.000Z')).toBe(true)
    expect(sameSyncValue(undefined, null)).toBe(true)
    expect(sameSyncValue([1, 2], [2, 1])).toBe(false)
  })
})

describe('status moves by sync', () => {
  const status = (server: MergeInput['serverStatus'], device: string, role: MergeInput['role'] = 'mechanic') =>
    mergeCallField(base({ field: 'status', server, device, base: { value: server }, serverStatus: server, role }))

  it('moves forward, also past a step the device skipped', () => {
    expect(status('assigned', 'en_route')).toEqual({ action: 'take', value: 'en_route' })
    expect(status('en_route', 'completed')).toEqual({ action: 'take', value: 'completed' })
  })

  it('never moves backwards: the server keeps its status without a conflict', () => {
    const d = status('on_site', 'en_route')
    expect(d.action).toBe('keep')
    expect(d.action === 'keep' && d.reason).toMatch(/^status: .*never moves a status back/)
  })

  it('moves forward even when the server moved too since the device base', () => {
    const d = mergeCallField(base({
      field: 'status', server: 'en_route', device: 'on_site', base: { value: 'assigned' }, serverStatus: 'en_route',
    }))
    expect(d).toEqual({ action: 'take', value: 'on_site' })
  })

  it('makes completing a cancelled call a conflict', () => {
    const d = status('cancelled', 'completed')
    expect(d.action).toBe('conflict')
    expect(d.action === 'conflict' && d.reason).toMatch(/cancelled/)
  })

  it('makes cancelling a completed call a conflict, and lets dispatch cancel an open one', () => {
    expect(status('completed', 'cancelled', 'dispatcher').action).toBe('conflict')
    expect(status('en_route', 'cancelled', 'dispatcher')).toEqual({ action: 'take', value: 'cancelled' })
  })

  it('refuses statuses the role may not set by sync', () => {
    expect(status('en_route', 'cancelled', 'mechanic')).toMatchObject({ action: 'reject', reason: expect.stringMatching(/^status: /) })
    expect(status('completed', 'invoiced', 'office').action).toBe('reject')
  })
})

describe('locked calls and field owners', () => {
  it('makes any field change on an invoiced or paid call a conflict with that reason', () => {
    for (const s of ['invoiced', 'paid'] as const) {
      const d = mergeCallField(base({ serverStatus: s, server: 'old', base: { value: 'old' } }))
      expect(d.action).toBe('conflict')
      expect(d.action === 'conflict' && d.reason).toBe(`storyCause: the call is ${s} and takes no more field changes`)
    }
    expect(mergeCallField(base({ field: 'status', serverStatus: 'invoiced', server: 'invoiced', device: 'completed' })).action)
      .toBe('conflict')
  })

  it('closes a cancelled call to field changes too, as the phone does', () => {
    const d = mergeCallField(base({ serverStatus: 'cancelled', server: 'old', base: { value: 'old' } }))
    expect(d).toEqual({ action: 'conflict', reason: 'storyCause: the call was cancelled and takes no more field changes' })
  })

  it('lets an unchanged value through on a locked call without a conflict', () => {
    expect(mergeCallField(base({ serverStatus: 'paid', server: 'same', device: 'same' }))).toEqual({ action: 'same' })
  })

  it('refuses a dispatch field from a mechanic, naming it; dispatch may change it', () => {
    const d = mergeCallField(base({ field: 'poNumber', device: 'PO-1', server: null }))
    expect(d).toMatchObject({ action: 'reject', reason: expect.stringMatching(/^poNumber: a dispatch field/) })
    expect(mergeCallField(base({ field: 'poNumber', device: 'PO-1', server: null, role: 'dispatcher' })).action).toBe('take')
    expect(mergeCallField(base({ field: 'complaint', device: 'x', server: 'y', base: { value: 'y' }, role: 'office' })).action)
      .toBe('reject')
  })

  it('refuses link fields by sync for everyone, and unknown fields', () => {
    expect(mergeCallField(base({ field: 'mechanicId', device: null, role: 'admin' })).action).toBe('reject')
    expect(mergeCallField(base({ field: 'version', device: 9 })).action).toBe('reject')
  })
})
