// The demo's calls tell stories a mechanic can check. Where a call says a temperature sensor was
// open, or its gauge reads cold with the engine warm, its fault code is the one an open sensor
// sets: the controller pulls the signal up, so an open NTC sensor reads the circuit-high voltage
// (SAE J2012 "circuit high"; SAE J1939-73 FMI 3, voltage above normal), never the circuit-low one.
import { afterAll, describe, expect, it } from 'vitest'
import { dtcMeaning } from '../../shared/utils/dtc'
import { closeTestPool, testPool } from '../support/db'

afterAll(closeTestPool)

describe('seeded calls that say a sensor was open', () => {
  it('carry the circuit-high code, and no circuit-low one', async () => {
    const { rows } = await testPool().query(
      `SELECT c.number, c.complaint, c.story_cause, f.code, f.spn, f.fmi FROM calls c JOIN fault_codes f ON f.call_id = c.id
       WHERE c.story_cause ~* 'sensor[^.]*open' OR c.complaint ~* '(reads|stuck at) cold'`,
    )
    // the demo has such calls: the coolant sensor code on unit 14 (server/db/seed/core.ts)
    expect(rows.length).toBeGreaterThanOrEqual(2)
    for (const r of rows) {
      const said = `call #${r.number}: ${r.story_cause ?? r.complaint}`
      if (r.code) {
        // SAE J2012 meanings as Wayside words them (REFERENCES.md §4)
        expect(dtcMeaning(r.code), said).toMatch(/circuit high/i)
      }
      else {
        // SAE J1939-73 FMI 3: voltage above normal, or shorted to a high source
        expect(r.fmi, said).toBe(3)
      }
    }
  })

  it('and a story that says open says what was measured', async () => {
    const { rows } = await testPool().query(`SELECT story_cause FROM calls WHERE story_cause ~* 'sensor[^.]*open'`)
    // common practice: an open sensor is found with the ohmmeter across its pins (OL), not guessed from the code
    expect(rows.length).toBeGreaterThan(0)
    for (const r of rows) expect(r.story_cause).toMatch(/OL|open circuit/)
  })
})
