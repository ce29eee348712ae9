// The dispatch fields of a call as form text, and back: for the call page's edit with versions.
import type { CallPatchInput } from '#shared/schemas/calls'

export type CallEditDraft = {
  unitId: string
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
  callerName: string
  callerPhone: string
  poNumber: string
  authLimit: string
}
type CallFields = {
  unitId: string | null
  locationText: string
  lat: number | null
  lon: number | null
  complaint: string
  lamps: string[]
  derate: CallEditDraft['derate']
  derateNote: string | null
  loaded: boolean
  hazmat: boolean
  safetyNotes: string | null
  callerName: string | null
  callerPhone: string | null
  poNumber: string | null
  authLimitCents: number | null
}
const KNOWN_LAMPS = ['check_engine', 'stop_engine', 'emissions', 'def', 'abs', 'charging', 'oil_pressure', 'coolant']

export function callEditDraftOf(c: CallFields): CallEditDraft {
  return {
    unitId: c.unitId ?? '', locationText: c.locationText,
    lat: c.lat === null ? '' : String(c.lat), lon: c.lon === null ? '' : String(c.lon),
    complaint: c.complaint, lamps: c.lamps.filter(l => KNOWN_LAMPS.includes(l)),
    otherLamps: c.lamps.filter(l => !KNOWN_LAMPS.includes(l)).join(', '),
    derate: c.derate, derateNote: c.derateNote ?? '', loaded: c.loaded, hazmat: c.hazmat, safetyNotes: c.safetyNotes ?? '',
    callerName: c.callerName ?? '', callerPhone: c.callerPhone ?? '', poNumber: c.poNumber ?? '',
    authLimit: c.authLimitCents === null ? '' : (c.authLimitCents / 100).toFixed(2),
  }
}

/** The form as PATCH fields (all of them; the caller keeps only those that changed). */
export function callPatchOf(d: CallEditDraft): Omit<CallPatchInput, 'version'> {
  const other = d.otherLamps.split(',').map(s => s.trim()).filter(Boolean)
  return {
    unitId: d.unitId || null, locationText: d.locationText, lat: numberFromText(d.lat), lon: numberFromText(d.lon), complaint: d.complaint,
    lamps: [...d.lamps, ...other], derate: d.derate, derateNote: d.derateNote || null, loaded: d.loaded, hazmat: d.hazmat,
    safetyNotes: d.safetyNotes || null, callerName: d.callerName || null, callerPhone: d.callerPhone || null, poNumber: d.poNumber || null,
    authLimitCents: centsFromText(d.authLimit),
  }
}

export const CALL_FIELD_LABELS: Record<keyof ReturnType<typeof callPatchOf>, string> = {
  customerId: 'Customer', unitId: 'Unit', locationText: 'Location', lat: 'Latitude', lon: 'Longitude',
  complaint: 'Complaint', lamps: 'Lamps',
  derate: 'Engine', derateNote: 'Derate detail', loaded: 'Loaded', hazmat: 'Hazmat', safetyNotes: 'Scene safety', callerName: 'Caller',
  callerPhone: 'Call-back number', poNumber: 'PO number', authLimitCents: 'Authorized up to',
}

export const showValue = (v: unknown) => (v === null || v === undefined || v === ''
  ? ''
  : Array.isArray(v) ? v.join(', ') : typeof v === 'boolean' ? (v ? 'yes' : 'no') : String(v))
