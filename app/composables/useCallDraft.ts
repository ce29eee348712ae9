// The call being taken, kept in localStorage as it is typed so a closed tab or a crash loses
// nothing; restored with a notice and cleared once the call is saved. One draft per person.
import type { CallCreateInput } from '#shared/schemas/calls'
import type { CustomerDraft, UnitDraft } from '~/utils/fleetDrafts'

export type CallDraft = {
  customerMode: 'pick' | 'new'
  customerId: string
  customerQuery: string
  newCustomer: CustomerDraft
  unitMode: 'pick' | 'new'
  unitId: string
  unitQuery: string
  newUnit: UnitDraft
  callerName: string
  callerPhone: string
  siteId: string
  locationText: string
  lat: string
  lon: string
  complaint: string
  lamps: string[]
  otherLamps: string
  derate: 'none' | 'derated' | 'countdown' | 'shutdown'
  derateNote: string
  loaded: boolean
  hazmat: boolean
  safetyNotes: string
  poNumber: string
  authLimit: string
  mechanicId: string
}

export const blankCallDraft = (): CallDraft => ({
  customerMode: 'pick', customerId: '', customerQuery: '', newCustomer: blankCustomer(),
  unitMode: 'pick', unitId: '', unitQuery: '', newUnit: blankUnit(),
  callerName: '', callerPhone: '', siteId: '', locationText: '', lat: '', lon: '',
  complaint: '', lamps: [], otherLamps: '', derate: 'none', derateNote: '', loaded: false, hazmat: false, safetyNotes: '',
  poNumber: '', authLimit: '', mechanicId: '',
})

/** True when nothing worth keeping has been typed. */
export function isBlankDraft(d: CallDraft) {
  return JSON.stringify(d) === JSON.stringify(blankCallDraft())
}

/** The draft as the body of POST /api/calls (validated by the same schema as the server). */
export function callInputOf(d: CallDraft): CallCreateInput {
  const other = d.otherLamps.split(',').map(s => s.trim()).filter(Boolean)
  const unitGiven = d.unitMode === 'new' ? Object.values(d.newUnit).some(v => v !== '' && v !== 'km') : false
  return {
    customerId: d.customerMode === 'pick' ? (d.customerId || undefined) : undefined,
    newCustomer: d.customerMode === 'new' ? customerInput(d.newCustomer) : undefined,
    unitId: d.customerMode === 'pick' && d.unitMode === 'pick' && d.unitId ? d.unitId : undefined,
    newUnit: d.unitMode === 'new' && unitGiven ? unitInput(d.newUnit) : undefined,
    callerName: d.callerName, callerPhone: d.callerPhone,
    locationText: d.locationText, lat: numberFromText(d.lat), lon: numberFromText(d.lon),
    complaint: d.complaint, lamps: [...d.lamps, ...other], derate: d.derate, derateNote: d.derateNote,
    loaded: d.loaded, hazmat: d.hazmat, safetyNotes: d.safetyNotes,
    poNumber: d.poNumber, authLimitCents: centsFromText(d.authLimit), mechanicId: d.mechanicId || undefined,
  }
}

export function useCallDraft(userId: () => string | undefined) {
  const draft = ref<CallDraft>(blankCallDraft())
  const restoredAt = ref<string | null>(null)
  const key = () => `wayside:call-draft:${userId() ?? 'anyone'}`
  let ready = false

  function save() {
    if (!ready || !import.meta.client) return
    try {
      if (isBlankDraft(draft.value)) localStorage.removeItem(key())
      else localStorage.setItem(key(), JSON.stringify({ savedAt: new Date().toISOString(), draft: draft.value }))
    }
    catch { /* storage full or blocked: the form still works, only the safety net is gone */ }
  }
  const saveSoon = useDebounceFn(save, 250)
  watch(draft, () => saveSoon(), { deep: true })

  onMounted(() => {
    try {
      const raw = localStorage.getItem(key())
      if (raw) {
        const saved = JSON.parse(raw) as { savedAt: string, draft: Partial<CallDraft> }
        draft.value = { ...blankCallDraft(), ...saved.draft }
        if (!isBlankDraft(draft.value)) restoredAt.value = saved.savedAt
      }
    }
    catch { /* a broken draft is dropped */ }
    ready = true
    window.addEventListener('pagehide', save)
  })
  onBeforeUnmount(() => {
    if (import.meta.client) {
      save()
      window.removeEventListener('pagehide', save)
    }
  })

  function clear() {
    draft.value = blankCallDraft()
    restoredAt.value = null
    if (import.meta.client) localStorage.removeItem(key())
  }
  return { draft, restoredAt, clear, save }
}
