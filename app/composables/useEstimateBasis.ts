import { readEstimateBasis, type EstimateBasis } from '~/utils/fieldEstimate'

// The rates, trucks and stock the last sync brought, read from the device and again after each pull.
export function useEstimateBasis() {
  const sync = useSyncStore()
  const basis = ref<EstimateBasis | null>(null)
  const load = async () => {
    basis.value = await readEstimateBasis()
  }
  onMounted(load)
  watch(() => sync.pulls, load)
  return basis
}
