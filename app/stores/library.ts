// The test-card library on the phone: fetched when there is signal, kept in IndexedDB
// (deviceStore('library')) so the runner opens with no signal. In-progress runs live in the
// same store under their own keys, with a copy of the card version they use.
import { acceptHMRUpdate, defineStore } from 'pinia'
import { del, entries, get, set } from 'idb-keyval'
import { ref, shallowRef } from 'vue'
import type { TestCardView } from '#shared/schemas/testCards'
import type { CardRun } from '#shared/utils/cardRun'
import { deviceStore } from '../utils/deviceDb'

const LIST_KEY = 'cards'
const cardKey = (id: string, version: number) => `card:${id}@${version}`
const runKey = (callId: string, cardId: string) => `run:${callId}:${cardId}`

const parseRun = (raw: string): CardRun => JSON.parse(raw, (k, v) => (k === 'value' && v === 'Infinity' ? Infinity : v))

export const useLibraryStore = defineStore('library', () => {
  const cards = shallowRef<TestCardView[]>([])
  const fetchedAt = ref<string | null>(null)
  const loaded = ref(false)
  const offline = ref(false)

  async function loadCached() {
    const cached = await get<{ items: TestCardView[], fetchedAt: string }>(LIST_KEY, deviceStore('library'))
    if (cached) { cards.value = cached.items; fetchedAt.value = cached.fetchedAt }
    loaded.value = true
  }

  /** Asks the server for the library; with no signal the cached copy stays and `offline` says so. */
  async function refresh() {
    try {
      const { items } = await $fetch<{ items: TestCardView[] }>('/api/test-cards', { retry: 0, timeout: 8000 })
      const now = new Date().toISOString()
      await set(LIST_KEY, { items, fetchedAt: now }, deviceStore('library'))
      for (const c of items) await set(cardKey(c.id, c.version), c, deviceStore('library'))
      cards.value = items
      fetchedAt.value = now
      offline.value = false
    }
    catch { offline.value = true }
  }

  /** Cached cards at once, then a refresh in the background (awaited when nothing is cached). */
  async function ensure() {
    if (!loaded.value) await loadCached()
    const r = refresh()
    if (!cards.value.length) await r
  }

  /** One card at a version (latest when absent): from the device first, else the server. */
  async function card(id: string, version?: number): Promise<TestCardView | undefined> {
    if (!loaded.value) await loadCached()
    const latest = cards.value.find(c => c.id === id)
    if (latest && (version === undefined || latest.version === version)) return latest
    if (version !== undefined) {
      const kept = await get<TestCardView>(cardKey(id, version), deviceStore('library'))
      if (kept) return kept
    }
    try {
      const fetched = await $fetch<TestCardView>(`/api/test-cards/${id}`, { query: version ? { version } : {}, retry: 0, timeout: 8000 })
      await set(cardKey(fetched.id, fetched.version), fetched, deviceStore('library'))
      return fetched
    }
    catch { return undefined }
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

  return { cards, fetchedAt, loaded, offline, loadCached, refresh, ensure, card, getRun, saveRun, dropRun, runsOfCall }
})

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(useLibraryStore, import.meta.hot))
