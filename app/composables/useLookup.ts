import type { ComboOption } from '~/utils/dataTable'

/**
 * Search-as-you-type for a combobox: asks `url` with `q` (and any `extra` query) after a short
 * pause and keeps only the answer to the latest question. Until that answer is in, the options of
 * the previous answer are narrowed to the text typed so far, and `loading` stays true, so a fast
 * "type, Enter" never picks a row that no longer matches.
 */
export function useLookup<T>(
  url: string,
  q: Ref<string>,
  map: (row: T) => ComboOption,
  extra: () => Record<string, string | undefined> = () => ({}),
) {
  const rows = ref<T[]>([]) as Ref<T[]>
  const answered = ref<string | null>(null)
  const running = ref(false)
  const question = () => JSON.stringify([q.value.trim(), extra()])
  let asked = 0
  async function run() {
    const n = ++asked
    const qs = question()
    running.value = true
    try {
      const res = await $fetch<{ items: T[] }>(url, { query: { q: q.value.trim() || undefined, pageSize: 8, ...extra() } })
      if (n === asked) {
        rows.value = res.items
        answered.value = qs
      }
    }
    catch {
      if (n === asked) {
        rows.value = []
        answered.value = qs
      }
    }
    finally { if (n === asked) running.value = false }
  }
  watchDebounced(question, run, { debounce: 150 })
  // A first list before anything is typed (client only: the server has no session cookie here).
  onMounted(run)
  const loading = computed(() => running.value || answered.value !== question())
  const options = computed(() => {
    const all = rows.value.map(map)
    if (answered.value === question()) return all
    const text = q.value.trim().toLowerCase()
    return all.filter(o => `${o.label} ${o.hint ?? ''}`.toLowerCase().includes(text))
  })
  return { rows, options, loading, run }
}
