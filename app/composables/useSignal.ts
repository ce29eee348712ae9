// Whether the phone has signal, as the person should be told: the network's own state (online and
// offline events) and the outcome of the last request to Wayside, not the sign-in check.
export function useSignal() {
  const online = useOnline()
  const sync = useSyncStore()
  const noSignal = computed(() => !online.value || sync.reachable === false)
  return { noSignal }
}
