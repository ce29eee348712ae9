import type { CallAssignInput, CallPatchInput } from '#shared/schemas/calls'

export const callRecordKey = (id: string) => `call-${id}`
export const suggestionsKey = (id: string) => `suggestions-${id}`

/** Office writes on one call; each refreshes the record, the suggestions and the board. */
export function useCallActions(id: () => string) {
  const refreshKeys = useRefreshKeys()
  const refreshAll = () => refreshKeys([callRecordKey(id()), suggestionsKey(id()), DISPATCH_KEY])
  async function assign(input: CallAssignInput) {
    type Answer = { mail: { queued: boolean, reason?: string } | null }
    const res = await $fetch<Answer>(`/api/calls/${id()}/assign`, { method: 'POST', body: input })
    await refreshAll()
    return res
  }
  async function save(patch: CallPatchInput) {
    await $fetch(`/api/calls/${id()}`, { method: 'PATCH', body: patch })
    await refreshAll()
  }
  async function cancel(reason: string, version: number) {
    await $fetch(`/api/calls/${id()}/cancel`, { method: 'POST', body: { reason, version } })
    await refreshAll()
  }
  async function resolveConflict(conflictId: string, body: { choice: 'device' | 'server' | 'value', value?: unknown }) {
    await $fetch(`/api/conflicts/${conflictId}/resolve`, { method: 'POST', body })
    await refreshAll()
  }
  return { assign, save, cancel, resolveConflict }
}
