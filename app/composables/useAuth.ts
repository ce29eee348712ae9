import type { User } from '#auth-utils'
import type { LoginInput } from '#shared/schemas/auth'
import { ROLE_HOME } from '#shared/utils/roles'

export function useAuth() {
  const { fetch: refreshSession, clear } = useUserSession()

  async function signIn(input: LoginInput, next?: string) {
    const { user } = await $fetch<{ user: User }>('/api/auth/login', { method: 'POST', body: input })
    await refreshSession()
    await rememberDeviceUser(user).catch(() => {}) // offline sign-in memory is a bonus, never a blocker
    // Unsynced work lives in IndexedDB: ask the browser not to clear it when space runs low.
    if (user.role === 'mechanic') await navigator.storage?.persist?.().catch(() => false)
    const safeNext = next && next.startsWith('/') && !next.startsWith('//') ? next : undefined
    await navigateTo(safeNext ?? ROLE_HOME[user.role])
    return user
  }

  async function signOut() {
    await $fetch('/api/auth/logout', { method: 'POST' }).catch(() => {})
    await clear().catch(() => {})
    await forgetDeviceUser()
    await navigateTo('/login')
  }

  return { signIn, signOut }
}
