import type { CallStatus } from '#shared/schemas/calls'

export const DISPATCH_KEY = 'dispatch-open'
/** How often the board asks again; two dispatchers see each other's work within this. */
export const DISPATCH_POLL_MS = 10_000

export type BoardCall = {
  id: string
  number: number
  status: CallStatus
  receivedAt: string
  assignedAt: string | null
  enRouteAt: string | null
  statusChangedAt: string
  locationText: string
  complaint: string
  derate: 'none' | 'derated' | 'countdown' | 'shutdown'
  hazmat: boolean
  loaded: boolean
  lamps: string[]
  poNumber: string | null
  customer: { id: string, name: string }
  unit: { id: string, unitNumber: string, yearMakeModel: string | null } | null
  mechanic: { id: string, name: string } | null
  /** The mechanic asked the fleet for more and no answer is recorded yet. */
  awaitingApproval?: boolean
}

/**
 * The open calls, asked again every few seconds while the page is visible and at once when it
 * comes back. Hooks are set before anything is awaited; the page awaits `ready`.
 */
export function useDispatchBoard() {
  const fetched = useFetch<{ items: BoardCall[], total: number }>('/api/calls', {
    key: DISPATCH_KEY, query: { open: 'true', pageSize: 200, sort: 'receivedAt', dir: 'asc' },
  })
  const lastLoaded = ref(Date.now())
  watch(fetched.data, () => {
    lastLoaded.value = Date.now()
  })
  const visible = useDocumentVisibility()
  const { pause, resume } = useIntervalFn(() => fetched.refresh(), DISPATCH_POLL_MS, { immediate: false })
  onMounted(resume)
  onBeforeUnmount(pause)
  watch(visible, (v) => {
    if (v === 'visible') {
      fetched.refresh()
      resume()
    }
    else pause()
  })
  return { data: fetched.data, error: fetched.error, refresh: fetched.refresh, status: fetched.status, lastLoaded, ready: fetched }
}

export type BoardFilter = { status: CallStatus | '', mechanicId: string, customerId: string }

export function matchesFilter(c: BoardCall, f: BoardFilter) {
  if (f.status && c.status !== f.status) return false
  if (f.mechanicId === 'none' ? c.mechanic !== null : f.mechanicId && c.mechanic?.id !== f.mechanicId) return false
  if (f.customerId && c.customer.id !== f.customerId) return false
  return true
}
