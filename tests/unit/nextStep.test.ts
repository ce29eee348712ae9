// The next-step button's decision table: a road call walked from assigned to synced, one fixture per
// row, each the record as the phone keeps it. The order is the shop's way of working a call (common
// practice): drive, arrive, make the scene safe (49 CFR 392.22 warning devices are on the scene
// checklist), start the labor clock, read the codes, a card customer's driver signs the estimate before
// the repair, record the repair and its story, prove it, finish, the driver signs, sync.
import { describe, expect, it } from 'vitest'
import { SCENE_CHECKLIST } from '../../shared/utils/safety'
import { nextStep, repairOnRecord, type NextStepContext, type NextStepRecord } from '../../app/utils/nextStep'

const AT = '2026-12-01T14:00:00.000Z'
const allScene = Object.fromEntries(SCENE_CHECKLIST.map(i => [i.id, true]))
const passed = { passed: true, codesCleared: true, lampsOff: true }

function record(call: Record<string, unknown>, over: Partial<Record<keyof NextStepRecord, unknown[]>> = {}): NextStepRecord {
  return {
    call: { id: 'c1', status: 'assigned', ...call },
    clockEvents: [], faultCodes: [], readings: [], testRuns: [], partLines: [], signOffs: [], conflicts: [],
    ...over,
  } as unknown as NextStepRecord
}
const quiet: NextStepContext = { estimate: null, waiting: 0 }
const work = [{ id: 'k1', kind: 'work_start', deviceAt: AT }]
const code = [{ id: 'f1', spn: 110, fmi: 0 }]
const part = [{ id: 'p1', partNumber: 'TR-DEF-10', description: 'DEF', quantity: 3 }]
const onSite = { status: 'on_site', sceneChecklist: allScene }

// [row, record, context, expected key, expected action]
const TABLE: [string, NextStepRecord, NextStepContext, string, unknown][] = [
  ['assigned: leave for the truck (a status step)', record({}), quiet, 'drive', { kind: 'status', step: 'en_route' }],
  ['driving: mark arrived (a status step)', record({ status: 'en_route' }), quiet, 'arrive', { kind: 'status', step: 'on_site' }],
  ['at the truck, nothing ticked: the scene first', record({ status: 'on_site' }), quiet, 'scene', { kind: 'section', id: 'scene-title' }],
  ['scene half done: still the scene', record({ status: 'on_site', sceneChecklist: { hazard_lamps: true } }), quiet, 'scene',
    { kind: 'section', id: 'scene-title' }],
  ['scene done, no labor clock: start it', record(onSite), quiet, 'work', { kind: 'status', step: 'work_start' }],
  ['working, nothing read: the codes', record(onSite, { clockEvents: work }), quiet, 'codes', { kind: 'section', id: 'codes-title' }],
  ['a reading instead of a code counts as read', record(onSite, { clockEvents: work, readings: [{ id: 'r1' }] }), quiet, 'repair',
    { kind: 'section', id: 'parts-title' }],
  ['card customer unsigned: the estimate before the repair', record(onSite, { clockEvents: work, faultCodes: code }),
    { estimate: 'unsigned', waiting: 0 }, 'estimate', { kind: 'section', id: 'presign-title' }],
  ['codes read: record the repair', record(onSite, { clockEvents: work, faultCodes: code }), quiet, 'repair',
    { kind: 'section', id: 'parts-title' }],
  ['a part but no cause: the story', record(onSite, { clockEvents: work, faultCodes: code, partLines: part }), quiet, 'story',
    { kind: 'section', id: 'story-title' }],
  ['story written, not verified: verify', record({ ...onSite, storyCause: 'Diluted DEF', storyCorrection: 'Refilled' },
    { clockEvents: work, faultCodes: code }), quiet, 'verify', { kind: 'section', id: 'verify-title' }],
  ['a part added past the signature: sign the new estimate', record({ ...onSite, storyCause: 'x', storyCorrection: 'y' },
    { clockEvents: work, faultCodes: code, partLines: part }), { estimate: 'above', waiting: 0 }, 'estimate',
  { kind: 'section', id: 'presign-title' }],
  ['verified: choose how the call ended', record({ ...onSite, storyCause: 'x', storyCorrection: 'y', verification: passed },
    { clockEvents: work, faultCodes: code }), quiet, 'finish', { kind: 'status', step: 'finish' }],
  ['not fixed, a follow-up written: finish without verifying', record({ ...onSite, storyCause: 'x', storyCorrection: 'Towed',
    followUp: 'Tow to the shop for an injector' }, { clockEvents: work, faultCodes: code }), quiet, 'finish',
  { kind: 'status', step: 'finish' }],
  ['completed, not signed: the driver signs', record({ status: 'completed' }, { faultCodes: code }), { estimate: null, waiting: 4 },
    'signoff', { kind: 'section', id: 'sign-title' }],
  ['signed, changes waiting: sync', record({ status: 'completed' }, { signOffs: [{ id: 's1' }] }), { estimate: null, waiting: 4 }, 'sync',
    { kind: 'sync' }],
  ['signed and synced: nothing left', record({ status: 'completed' }, { signOffs: [{ id: 's1' }] }), quiet, 'done', { kind: 'none' }],
  ['billed: nothing left even without a sign-off', record({ status: 'invoiced' }), quiet, 'done', { kind: 'none' }],
  ['a conflict to settle comes first', record(onSite, { conflicts: [{ id: 'x1' }] }), quiet, 'conflicts',
    { kind: 'section', id: 'conflicts-title' }],
  ['not assigned yet: wait', record({ status: 'received' }), quiet, 'wait', { kind: 'none' }],
]

describe('the next step on a call', () => {
  it.each(TABLE)('%s', (_row, r, ctx, key, action) => {
    const step = nextStep(r, ctx)
    expect(step.key).toBe(key)
    expect(step.action).toEqual(action)
    expect(step.label.length).toBeGreaterThan(3)
  })

  it('names the estimate step for what the driver signs: first or again', () => {
    const r = record(onSite, { clockEvents: work, faultCodes: code })
    expect(nextStep(r, { estimate: 'unsigned', waiting: 0 }).label).toBe('Have the driver sign the estimate')
    expect(nextStep(r, { estimate: 'above', waiting: 0 }).label).toBe('Have the driver sign the new estimate')
  })

  it('counts the changes waiting in the sync step', () => {
    const r = record({ status: 'completed' }, { signOffs: [{ id: 's1' }] })
    expect(nextStep(r, { estimate: null, waiting: 1 }).hint).toBe('1 change waits to go to the office')
    expect(nextStep(r, { estimate: null, waiting: 3 }).hint).toBe('3 changes wait to go to the office')
  })
})

describe('a repair on record (when a code may be marked cleared)', () => {
  it('is a part on the list or the correction written, not blank space', () => {
    expect(repairOnRecord(record({}) as never)).toBe(false)
    expect(repairOnRecord(record({ storyCorrection: '   ' }) as never)).toBe(false)
    expect(repairOnRecord(record({ storyCorrection: 'Replaced the sensor' }) as never)).toBe(true)
    expect(repairOnRecord(record({}, { partLines: part }) as never)).toBe(true)
  })
})
