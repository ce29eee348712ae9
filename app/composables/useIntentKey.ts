import type { WatchSource } from 'vue'

/**
 * One idempotency key per intent to pay: the same key while a request for it is retried (a lost
 * answer, a double click), a new one once an answer came back or the form changed.
 */
export function useIntentKey(source?: WatchSource | WatchSource[]) {
  const key = ref(crypto.randomUUID())
  const renew = () => {
    key.value = crypto.randomUUID()
  }
  if (source) watch(source, renew, { deep: true })
  return { key, renew }
}
