import type { UserCreateInput, UserPatchInput } from '#shared/schemas/users'

export const PEOPLE_KEY = 'setup-people'

export function usePeople() {
  // Not refreshNuxtData: it waits for an idle moment that may not come (useRefreshKeys.ts).
  const refresh = useRefreshKeys()
  async function addPerson(input: UserCreateInput) {
    await $fetch('/api/users', { method: 'POST', body: input })
    await refresh(PEOPLE_KEY)
  }
  async function changePerson(id: string, patch: UserPatchInput) {
    await $fetch(`/api/users/${id}`, { method: 'PATCH', body: patch })
    await refresh(PEOPLE_KEY)
  }
  return { addPerson, changePerson }
}

/** The field errors of a failed $fetch or of an op the device refused to queue, or a single `_` message. */
export function errorFields(err: any): Record<string, string> {
  const fields = err?.fields ?? err?.data?.data?.fields
  if (fields && typeof fields === 'object') return fields
  return { _: err?.data?.message ?? err?.message ?? 'Something went wrong' }
}
