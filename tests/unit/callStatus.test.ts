import { describe, expect, it } from 'vitest'
import {
  BILLED_STATUSES, CALL_STATUSES, canMoveStatus, canSeeCall, canWriteCall, CLOSED_STATUSES, DONE_STATUSES, isLockedStatus,
  LOCKED_STATUSES, OPEN_STATUSES, outcomeProblem, STATUS_TIME_FIELD,
} from '#shared/utils/callStatus'
import { calls, callStatusEnum } from '~~/server/db/schema'

// The call's status rules are Wayside's own (DESIGN.md, "Sync protocol" and the words table); the
// cases below are those rules written out.
describe('named status sets', () => {
  it('closes a cancelled call to field work, as billed ones are', () => {
    expect(isLockedStatus('cancelled')).toBe(true)
    expect([...LOCKED_STATUSES].sort()).toEqual([...BILLED_STATUSES, 'cancelled'].sort())
    expect(isLockedStatus('completed')).toBe(false)
  })

  it('splits every status into open or closed, and closed is done or cancelled', () => {
    expect([...OPEN_STATUSES, ...CLOSED_STATUSES].sort()).toEqual([...CALL_STATUSES].sort())
    expect([...CLOSED_STATUSES].sort()).toEqual([...DONE_STATUSES, 'cancelled'].sort())
  })

  it('gives the database enum the same statuses, and every status a time column on the call', () => {
    expect(callStatusEnum.enumValues).toEqual([...CALL_STATUSES])
    for (const s of CALL_STATUSES) expect(calls, s).toHaveProperty(STATUS_TIME_FIELD[s])
  })
})

describe('status moves', () => {
  it('goes forward only, cancels only before the work is done, and never leaves cancelled', () => {
    expect(canMoveStatus('assigned', 'on_site')).toBe(true)
    expect(canMoveStatus('on_site', 'en_route')).toBe(false)
    expect(canMoveStatus('on_site', 'cancelled')).toBe(true)
    expect(canMoveStatus('completed', 'cancelled')).toBe(false)
    expect(canMoveStatus('cancelled', 'completed')).toBe(false)
  })

  it('allows an outcome only once the work is done', () => {
    expect(outcomeProblem('on_site', 'repaired')).toMatch(/^outcome: /)
    expect(outcomeProblem('completed', 'repaired')).toBeUndefined()
    expect(outcomeProblem('on_site', null)).toBeUndefined()
  })
})

describe('access', () => {
  const call = { mechanicId: 'm1' }
  it('lets a mechanic reach only their own calls, and the office every call', () => {
    expect(canSeeCall({ id: 'm1', role: 'mechanic' }, call)).toBe(true)
    expect(canSeeCall({ id: 'm2', role: 'mechanic' }, call)).toBe(false)
    expect(canWriteCall({ id: 'm2', role: 'mechanic' }, { mechanicId: null })).toBe(false)
    for (const role of ['dispatcher', 'office', 'admin'] as const) expect(canWriteCall({ id: 'x', role }, call)).toBe(true)
  })
})
