// The test-card library on the phone. The sync brings it (app/utils/syncApply.ts stores every card
// of the pull in IndexedDB), so a phone that synced once opens every card with no signal; this
// store only reads the device. In-progress runs live in the same store under their own keys.
import { acceptHMRUpdate, defineStore } from 'pinia'
import { del, entries, get, set } from 'idb-keyval'
import { ref, shallowRef, watch } from 'vue'
import type { TestCardView } from '#shared/schemas/testCards'
import type { CardRun } from '#shared/utils/cardRun'
import { deviceStore } from '../utils/deviceDb'
import { CARD_LIST_KEY, cardKey, runKey, type LibraryList } from '../utils/libraryKeys'
import { useSyncStore } from './sync'

const parseRun = (raw: string): CardRun => JSON.parse(raw, (k, v) => (k === 'value' && v === 'Infinity' ? Infinity : v))

export const useLibraryStore = defineStore('library', () => {
  const cards = shallowRef<TestCardView[]>([])
  /** When the sync last stored the library; null before the first sync. */
  const fetchedAt = ref<string | null>(null)
  const loaded = ref(false)

  /** Reads the library the sync kept on the device (again after every sync that changed it). */
  async function ensure() {
    const kept = await get<LibraryList>(CARD_LIST_KEY, deviceStore('library'))
    cards.value = kept?.items ?? []
    fetchedAt.value = kept?.fetchedAt ?? null
    loaded.value = true
  }

  /** One card at a version (latest when absent); a run asks for the version it started with. */
  async function card(id: string, version?: number): Promise<TestCardView | undefined> {
    if (!loaded.value) await ensure()
    const latest = cards.value.find(c => c.id === id)
    if (latest && (version === undefined || latest.version === version)) return latest
    if (version === undefined) return undefined
    return get<TestCardView>(cardKey(id, version), deviceStore('library'))
  }

  async function getRun(callId: string, cardId: string) {
    const raw = await get<string>(runKey(callId, cardId), deviceStore('library'))
    return raw ? parseRun(raw) : undefined
  }
  async function saveRun(run: CardRun) {
    // Kept as JSON text: IndexedDB cannot clone Vue's reactive proxies, and JSON has no OL (Infinity).
    await set(runKey(run.callId, run.cardId), JSON.stringify(run, (_k, v) => (v === Infinity ? 'Infinity' : v)), deviceStore('library'))
  }
  async function dropRun(callId: string, cardId: string) {
    await del(runKey(callId, cardId), deviceStore('library'))
  }
  /** Runs started on this call and not yet saved to it. */
  async function runsOfCall(callId: string): Promise<CardRun[]> {
    const all = await entries<string, string>(deviceStore('library'))
    return all.filter(([k]) => String(k).startsWith(`run:${callId}:`)).map(([, v]) => parseRun(v))
  }

  // A sync that brought cards while a card list is open shows them at once.
  watch(() => useSyncStore().libraryPulls, () => { if (loaded.value) void ensure() })

  return { cards, fetchedAt, loaded, ensure, card, getRun, saveRun, dropRun, runsOfCall }
})

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(useLibraryStore, import.meta.hot))
