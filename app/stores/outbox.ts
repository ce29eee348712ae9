// What waits on the device, as the screens see it: the ops not yet accepted (pending or refused),
// the journal of what the server answered, the photos still to upload and the conflicts to settle.
// The sync pass that empties it is app/utils/syncClient.ts, run by the sync store.
import { acceptHMRUpdate, defineStore } from 'pinia'
import { computed, ref } from 'vue'
import { readDeviceLists } from '../utils/deviceRead'
import type { JournalEntry, OutboxEntry } from '../utils/fieldDb'

export type PhotoWaiting = { id: string, callId: string, size: number, opApplied: boolean, tries: number, lastError?: string }
/** An open conflict on one of the phone's calls that no choice has been made for yet. */
export type ToSettle = { callId: string, conflictId: string, entity: string, field: string, callNumber: number | null }

export const useOutboxStore = defineStore('outbox', () => {
  const entries = ref<OutboxEntry[]>([])
  const journal = ref<JournalEntry[]>([])
  const photos = ref<PhotoWaiting[]>([])
  /** Bumped after every local write, so the engine can sync soon. */
  const writes = ref(0)
  /** Open conflicts on the phone's calls that no choice has been made for yet. */
  const settle = ref<ToSettle[]>([])
  const toSettle = computed(() => settle.value.length)

  const pending = computed(() => entries.value.filter(e => e.state === 'pending'))
  const rejected = computed(() => entries.value.filter(e => e.state === 'rejected'))
  const waitingCount = computed(() => pending.value.length + photos.value.length)
  const isEmpty = computed(() => entries.value.length === 0 && photos.value.length === 0)

  async function refresh() {
    const { outbox: o, journal: j, photos: p, bundles } = await readDeviceLists({ photos: true, journal: 50 })
    settle.value = bundles.flatMap(b => Object.values(b.records.conflicts ?? {})
      .filter(c => (c.status ?? 'open') === 'open' && !c.pendingChoice)
      .map(c => ({
        callId: b.id, conflictId: c.id, entity: String(c.entity ?? 'call'), field: String(c.field ?? ''),
        callNumber: typeof b.call.number === 'number' ? b.call.number : null,
      })))
    entries.value = o
    journal.value = j
    photos.value = p.map(({ id, callId, size, opApplied, tries, lastError }) => ({ id, callId, size, opApplied, tries, lastError }))
  }

  async function noteWrite() {
    await refresh()
    writes.value++
  }

  return { entries, journal, photos, writes, settle, toSettle, pending, rejected, waitingCount, isEmpty, refresh, noteWrite }
})

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(useOutboxStore, import.meta.hot))
