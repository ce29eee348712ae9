// What the mechanic should do next on a call, read from the call's record alone: the one big button
// at the top of the call page (FieldNextStep) says it in words and either takes the status step or
// takes the mechanic to the section. The order follows a road call as it is worked: drive, arrive,
// make the scene safe, start the labor clock, read the codes, have a card customer's driver sign the
// estimate before the repair, record the repair and its story, prove it, finish, the driver signs,
// and sync.
import { sceneProgress } from '#shared/utils/safety'
import type { CallView } from '~/stores/field'

/** The part of a call's record the decision reads (a CallView has it all). */
export type NextStepRecord = Pick<CallView, 'call' | 'clockEvents' | 'faultCodes' | 'readings' | 'testRuns' | 'partLines' | 'signOffs'>
  & { conflicts: readonly unknown[] }

/** What the record cannot say: whether the driver must sign the estimate now, and how many changes wait to sync. */
export type NextStepContext = { estimate: 'unsigned' | 'above' | null, waiting: number }

export type StatusAction = 'en_route' | 'on_site' | 'work_start' | 'finish'
export type NextStepAction
  = | { kind: 'status', step: StatusAction }
    | { kind: 'section', id: string }
    | { kind: 'sync' }
    | { kind: 'none' }
export type NextStep = { key: string, label: string, hint: string, action: NextStepAction }

const text = (v: unknown) => (typeof v === 'string' ? v.trim() : '')

/**
 * Whether the repair is on record: a part put on the call's parts list, or the correction written.
 * A code is marked cleared only after this, so "cleared" means cleared after a repair, not before one.
 */
export function repairOnRecord(r: Pick<CallView, 'call' | 'partLines'>): boolean {
  return r.partLines.length > 0 || text(r.call.storyCorrection) !== ''
}

const section = (key: string, label: string, hint: string, id: string): NextStep =>
  ({ key, label, hint, action: { kind: 'section', id } })
const status = (key: string, label: string, hint: string, step: StatusAction): NextStep =>
  ({ key, label, hint, action: { kind: 'status', step } })

/** The next step, or `done` when nothing is left on the phone. */
export function nextStep(r: NextStepRecord, ctx: NextStepContext): NextStep {
  const s = String(r.call.status)
  const locked = ['invoiced', 'paid', 'cancelled'].includes(s)
  if (r.conflicts.length && !locked) {
    return section('conflicts', 'Settle what changed at the office', 'Pick which value stands before going on', 'conflicts-title')
  }
  if (s === 'received') return { key: 'wait', label: 'Wait for dispatch', hint: 'Not assigned to you yet', action: { kind: 'none' } }
  if (s === 'assigned') return status('drive', 'Leave for the truck', 'Starts the travel clock', 'en_route')
  if (s === 'en_route') return status('arrive', 'Mark arrived', 'Stops the travel clock at the truck', 'on_site')
  if (s === 'on_site') {
    const scene = sceneProgress((r.call.sceneChecklist ?? {}) as Record<string, boolean>)
    if (scene.done < scene.total) {
      return section('scene', 'Secure the scene', `${scene.done} of ${scene.total} checks done: flashers, devices, vest`, 'scene-title')
    }
    if (!r.clockEvents.some(e => e.kind === 'work_start')) {
      return status('work', 'Start the labor clock', 'Labor is billed from the clock, never typed', 'work_start')
    }
    if (!r.faultCodes.length && !r.readings.length && !r.testRuns.length) {
      return section('codes', 'Read the fault codes', 'Or take a reading, when the truck shows no code', 'codes-title')
    }
    if (ctx.estimate) {
      const label = ctx.estimate === 'above' ? 'Have the driver sign the new estimate' : 'Have the driver sign the estimate'
      return section('estimate', label, 'A card customer signs before the repair', 'presign-title')
    }
    if (!repairOnRecord(r)) return section('repair', 'Record the repair', 'The parts fitted and the correction', 'parts-title')
    if (!text(r.call.storyCause) || !text(r.call.storyCorrection)) {
      return section('story', 'Write the cause and correction', 'The story the office bills from', 'story-title')
    }
    const v = (r.call.verification ?? {}) as { passed?: unknown }
    if (v.passed !== true && !text(r.call.followUp)) {
      return section('verify', 'Verify the repair', 'Codes cleared, lamps off, a test drive', 'verify-title')
    }
    return status('finish', 'Choose how the call ended', 'Stops the clocks and marks the work done', 'finish')
  }
  if (s === 'completed' && !r.signOffs.length) {
    return section('signoff', 'Have the driver sign', 'Beneath the work, the hours and the amount', 'sign-title')
  }
  if (ctx.waiting > 0) {
    const hint = `${ctx.waiting} ${ctx.waiting === 1 ? 'change waits' : 'changes wait'} to go to the office`
    return { key: 'sync', label: 'Sync', hint, action: { kind: 'sync' } }
  }
  return { key: 'done', label: 'Nothing left to do here', hint: 'Everything on this call is at the office', action: { kind: 'none' } }
}
