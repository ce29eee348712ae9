// Whether the driver of a card customer's call must sign the estimate on the phone now: none signed
// yet, or the estimate went above what was signed. Priced offline from the rates the last sync
// brought, by the same estimate as the bill (shared/utils/estimate.ts), judged by the one rule module.
import { estimateCall } from '#shared/utils/estimate'
import {
  estimateToSign, signatureAsked, signatureInForce, signedPlanLeft, signingState, signsEstimate, type SigningState,
} from '#shared/utils/estimateSigning'
import type { CallView } from '~/stores/field'
import { fieldEstimateRecord, openRequest, readEstimateBasis, type EstimateBasis } from '~/utils/fieldEstimate'

/** Statuses at the truck, where the estimate is signed before the repair. */
const AT_TRUCK = new Set(['on_site'])

export function useEstimateSigning(view: () => CallView) {
  const sync = useSyncStore()
  const basis = ref<EstimateBasis | null>(null)
  const now = useNow({ interval: 30_000 })
  async function load() {
    basis.value = await readEstimateBasis()
  }
  onMounted(load)
  watch(() => sync.pulls, load)

  const card = computed(() => signsEstimate(view().customer))
  const signatures = computed(() => view().estimateSignatures.map(s => ({ ...s, amountCents: Number(s.amountCents ?? 0) })))
  /** The estimate now: the record with what the signed estimate still has to come, or with the work asked of the fleet. */
  const estimateCents = computed(() => {
    const v = view()
    const record = basis.value ? fieldEstimateRecord(v, basis.value, now.value) : null
    if (!record) return null
    const asked = openRequest(v)
    const last = signatureInForce(signatures.value)
    const plans = [
      asked ? { laborMinutes: Number(asked.plannedLaborMinutes ?? 0), parts: asked.plannedParts ?? [] } : undefined,
      last ? signedPlanLeft(last, record) : undefined,
    ]
    try {
      return Math.max(...plans.map(plan => estimateToSign(estimateCall(record, null, plan))))
    }
    catch {
      return null
    }
  })
  const state = computed<SigningState>(() => signingState(card.value, signatures.value, estimateCents.value))
  /** Asked now: a card customer's call at the truck with no signature, or with the estimate above it. */
  const asked = computed(() => AT_TRUCK.has(String(view().call.status)) && signatureAsked(state.value))
  return { basis, now, card, state, asked, estimateCents, signatures }
}
