// The checks that prove a repair, as the phone records them on the call's `verification` and
// the office and the service report read them back.
import { UNIT_SPACE, formatNumber } from './readingFormat'

export const VERIFICATION_CHECKS = [
  ['codesCleared', 'Fault codes cleared and not back'],
  ['liveValuesChecked', 'Live values re-read and in line with their like sensors'],
  ['lampsOff', 'Warning lamps off'],
  ['derateGone', 'Derate gone: full power on the test drive'],
] as const

export type VerificationCheck = (typeof VERIFICATION_CHECKS)[number][0]

export interface VerificationView {
  checks: { id: VerificationCheck, label: string, done: boolean }[]
  /** '12 km, 15 min', or undefined when no test drive was written down. */
  testDrive?: string
  liveValuesNote?: string
  passed: boolean
  checkedAt?: string
}

const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : undefined)

/** A call's saved verification in words; null when nothing was saved. */
export function verificationView(v: Record<string, unknown> | null | undefined): VerificationView | null {
  if (!v || typeof v !== 'object') return null
  const distance = num(v.testDriveKm)
  const minutes = num(v.testDriveMinutes)
  // The phone saves the distance in the unit the mechanic reads, and names that unit.
  const unit = v.distanceUnit === 'mi' ? 'mi' : 'km'
  const drive = [
    distance !== undefined && `${formatNumber(distance)}${UNIT_SPACE}${unit}`,
    minutes !== undefined && `${formatNumber(minutes)}${UNIT_SPACE}min`,
  ]
  const view: VerificationView = {
    checks: VERIFICATION_CHECKS.map(([id, label]) => ({ id, label, done: v[id] === true })),
    passed: v.passed === true,
  }
  if (drive.some(Boolean)) view.testDrive = drive.filter(Boolean).join(', ')
  if (typeof v.liveValuesNote === 'string' && v.liveValuesNote.trim()) view.liveValuesNote = v.liveValuesNote.trim()
  if (typeof v.checkedAt === 'string') view.checkedAt = v.checkedAt
  return view
}
