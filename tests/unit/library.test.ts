// The test-card library kept on the phone as the sync brings it, and runs in progress, over a fake IndexedDB.
import { beforeEach, describe, expect, it, vi } from 'vitest'
import { cardDefinitionSchema, type TestCardView } from '../../shared/schemas/testCards'
import { recordAnswer, recordReading, startRun } from '../../shared/utils/cardRun'
import { SEED_CARDS } from '../../server/db/seed/cards'
import { useLibraryStore } from '../../app/stores/library'
import { applyPull, readRates } from '../../app/utils/syncApply'
import { freshDevice, pullAnswer, reloadApp } from './outbox-support'

const egt = (version: number, title = 'Exhaust temperature sensor'): TestCardView => ({
  id: 'c0ffee00-0000-4000-8000-000000000001', slug: 'egt-rtd-sensor', title, componentType: 'RTD', active: true,
  currentVersion: version, version, updatedAt: '2026-03-01T10:00:00.000Z',
  definition: { ...cardDefinitionSchema.parse(SEED_CARDS[0]!.definition), title },
})

beforeEach(async () => {
  await freshDevice()
})

const pullCards = (cards: Record<string, unknown>[], cursor = 'c1') => applyPull(pullAnswer({ testCards: cards }, { cursor }))

describe('library on the phone', () => {
  it('comes with the first sync and opens with no other request', async () => {
    const fetch = vi.fn()
    vi.stubGlobal('$fetch', fetch)
    await pullCards([egt(1)])
    const lib = useLibraryStore()
    await lib.ensure()
    expect(lib.cards.map(c => c.title)).toEqual(['Exhaust temperature sensor'])
    await reloadApp()
    expect((await useLibraryStore().card(egt(1).id))?.version).toBe(1)
    expect(fetch).not.toHaveBeenCalled()
    vi.unstubAllGlobals()
  })

  it('takes an edited card on the next sync and keeps the older version a run still uses', async () => {
    await pullCards([egt(1)])
    await pullCards([egt(2, 'Revised')], 'c2')
    await reloadApp()
    const lib = useLibraryStore()
    await lib.ensure()
    expect(lib.cards.map(c => [c.title, c.version])).toEqual([['Revised', 2]])
    expect((await lib.card(egt(1).id))?.title).toBe('Revised')
    expect((await lib.card(egt(1).id, 1))?.title).toBe('Exhaust temperature sensor')
    expect(await lib.card(egt(1).id, 7)).toBeUndefined()
  })

  it('drops a turned-off card from the list, keeps others, and leaves out a card whose definition fails', async () => {
    const other = { ...egt(1, 'Battery'), id: 'c0ffee00-0000-4000-8000-000000000002', slug: 'battery' }
    await pullCards([egt(1), other, { ...egt(1, 'Broken'), id: 'c0ffee00-0000-4000-8000-000000000003', definition: { title: 'x' } }])
    await pullCards([{ ...egt(1), active: false }], 'c2')
    const lib = useLibraryStore()
    await lib.ensure()
    expect(lib.cards.map(c => c.title)).toEqual(['Battery'])
    expect(lib.fetchedAt).not.toBeNull()
  })

  it('keeps the rates the sync brought and reads the ones in force', async () => {
    const rates = (id: string, effectiveFrom: string, laborCentsPerHour: number) => ({
      id, effectiveFrom, laborCentsPerHour, afterHoursMultiplierPct: 150, minimumLaborTenths: 10, roadCallMinimumCents: 15000,
      travelCentsPerUnit: 250, travelUnit: 'km', partsMarkupPct: 25, taxRateBasisPoints: 700, laborTaxable: false,
      averageRoadKph: 70, version: 1,
    })
    expect(await readRates()).toBeUndefined()
    await applyPull(pullAnswer({ rates: [rates('r1', '2026-01-01T00:00:00.000Z', 12500)] }))
    await applyPull(pullAnswer({ rates: [rates('r2', '2026-03-01T00:00:00.000Z', 13500)] }, { cursor: 'c2' }))
    await reloadApp()
    expect(await readRates()).toMatchObject({ id: 'r2', laborCentsPerHour: 13500, travelUnit: 'km' })
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
