import type { ComboOption } from '~/utils/dataTable'

/**
 * Search-as-you-type for a combobox: asks `url` with `q` (and any `extra` query) after a short
 * pause, keeps only the answer to the latest question, and maps rows to options.
 */
export function useLookup<T>(url: string, q: Ref<string>, map: (row: T) => ComboOption, extra: () => Record<string, string | undefined> = () => ({})) {
  const rows = ref<T[]>([]) as Ref<T[]>
  const loading = ref(false)
  let asked = 0
  async function run() {
    const n = ++asked
    loading.value = true
    try {
      const res = await $fetch<{ items: T[] }>(url, { query: { q: q.value.trim() || undefined, pageSize: 8, ...extra() } })
      if (n === asked) rows.value = res.items
    }
    catch { if (n === asked) rows.value = [] }
    finally { if (n === asked) loading.value = false }
  }
  watchDebounced([q, () => JSON.stringify(extra())], run, { debounce: 150 })
  const options = computed(() => rows.value.map(map))
  return { rows, options, loading, run }
}
