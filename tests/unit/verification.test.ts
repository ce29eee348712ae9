// The repair checks as the office and the service report read them back.
import { describe, expect, it } from 'vitest'
import { UNIT_SPACE } from '../../shared/utils/readingFormat'
import { VERIFICATION_CHECKS, verificationView } from '../../shared/utils/verification'

const plain = (s: string | undefined) => s?.replaceAll(UNIT_SPACE, ' ')

describe('verificationView', () => {
  it('names every check, done or not, and the test drive in the unit the mechanic read', () => {
    // SI Brochure 5.4.3 (from memory for the section): a space between number and unit, "12 km"; "min" is the SI-accepted minute
    const saved = { codesCleared: true, liveValuesChecked: false, lampsOff: true, derateGone: true }
    const v = verificationView({ ...saved, testDriveKm: 12, testDriveMinutes: 15, passed: false })
    expect(v?.checks.map(c => [c.id, c.done]))
      .toEqual([['codesCleared', true], ['liveValuesChecked', false], ['lampsOff', true], ['derateGone', true]])
    expect(plain(v?.testDrive)).toBe('12 km, 15 min')
    expect(v?.passed).toBe(false)
    // the phone saves the distance in miles when the mechanic reads miles, and says so
    expect(plain(verificationView({ testDriveKm: 7.5, distanceUnit: 'mi', passed: true })?.testDrive)).toBe('7.5 mi')
    expect(VERIFICATION_CHECKS).toHaveLength(4)
  })

  it('nothing saved, or nonsense saved, reads as such', () => {
    // Wayside's own contract: the office page never breaks on what a phone sent
    expect(verificationView(null)).toBeNull()
    const odd = verificationView({ testDriveKm: 'far', liveValuesNote: '  ', codesCleared: 'yes' })
    expect(odd?.testDrive).toBeUndefined()
    expect(odd?.liveValuesNote).toBeUndefined()
    expect(odd?.checks[0]?.done).toBe(false)
  })
})
