// The test-card library kept on the phone, and runs in progress, over a fake IndexedDB.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { cardDefinitionSchema, type TestCardView } from '../../shared/schemas/testCards'
import { recordAnswer, recordReading, startRun } from '../../shared/utils/cardRun'
import { SEED_CARDS } from '../../server/db/seed/cards'
import { useLibraryStore } from '../../app/stores/library'
import { freshDevice, reloadApp } from './outbox-support'

const egt = (version: number, title = 'Exhaust temperature sensor'): TestCardView => ({
  id: 'c0ffee00-0000-4000-8000-000000000001', slug: 'egt-rtd-sensor', title, componentType: 'RTD', active: true,
  currentVersion: version, version, updatedAt: '2026-03-01T10:00:00.000Z',
  definition: { ...cardDefinitionSchema.parse(SEED_CARDS[0]!.definition), title },
})

let answer: () => unknown
beforeEach(async () => {
  await freshDevice()
  answer = () => ({ items: [egt(1)] })
  vi.stubGlobal('$fetch', vi.fn(async () => answer()))
})
afterEach(() => { vi.unstubAllGlobals() })

describe('library on the phone', () => {
  it('keeps the cards fetched with signal and opens them with none', async () => {
    await useLibraryStore().ensure()
    expect(useLibraryStore().cards.map(c => c.title)).toEqual(['Exhaust temperature sensor'])
    await reloadApp()
    answer = () => { throw new TypeError('Failed to fetch') }
    const lib = useLibraryStore()
    await lib.ensure()
    await lib.refresh()
    expect(lib.offline).toBe(true)
    expect(lib.cards).toHaveLength(1)
    expect((await lib.card(egt(1).id))?.version).toBe(1)
  })

  it('keeps an older version a run still uses after the library moved on', async () => {
    await useLibraryStore().ensure()
    answer = () => ({ items: [egt(2, 'Revised')] })
    await useLibraryStore().refresh()
    await reloadApp()
    answer = () => { throw new TypeError('Failed to fetch') }
    const lib = useLibraryStore()
    expect((await lib.card(egt(1).id))?.title).toBe('Revised')
    expect((await lib.card(egt(1).id, 1))?.title).toBe('Exhaust temperature sensor')
    expect(await lib.card(egt(1).id, 7)).toBeUndefined()
  })

  it('keeps a run in progress across a reload, OL included', async () => {
    const card = egt(1)
    let run = startRun({ id: 'run-1', callId: 'call-1', card, at: '2026-03-01T10:00:00.000Z' })
    // the look and the two live-data tests, then the sensor itself
    for (let i = 0; i < 3; i++) run = recordAnswer(run, { answer: 'yes', at: '2026-03-01T10:00:30.000Z' })
    const partTemp = { value: 12, unit: 'degC' as const }
    run = recordReading(run, { value: 'OL', unit: 'ohm', readingId: 'r1', at: '2026-03-01T10:01:00.000Z', partTemp })
    await useLibraryStore().saveRun(run)
    await reloadApp()
    const lib = useLibraryStore()
    const back = await lib.getRun('call-1', card.id)
    expect(back?.results[3]?.value).toBe(Infinity)
    expect(back?.results[3]?.entered).toEqual({ value: 'OL', unit: 'ohm' })
    expect((await lib.runsOfCall('call-1')).map(r => r.id)).toEqual(['run-1'])
    expect(await lib.runsOfCall('call-2')).toEqual([])
    await lib.dropRun('call-1', card.id)
    expect(await lib.getRun('call-1', card.id)).toBeUndefined()
  })
})
