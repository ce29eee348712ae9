import { del, get, set } from 'idb-keyval'
import type { User } from '#auth-utils'

const USER_KEY = 'signedInUser'

/** The person last signed in on this device, so the mechanic's screens open with no signal. */
export async function rememberDeviceUser(user: User) {
  if (import.meta.client) await set(USER_KEY, { ...user }, deviceStore('meta'))
}
export async function forgetDeviceUser() {
  if (import.meta.client) await del(USER_KEY, deviceStore('meta'))
}
export async function deviceUser(): Promise<User | undefined> {
  if (!import.meta.client) return undefined
  try {
    return await get<User>(USER_KEY, deviceStore('meta'))
  }
  catch { return undefined }
}

/**
 * Who is using the app: the live session when the server answers, otherwise (no signal, a
 * captive portal) the person remembered on this device. `offline` says which one it is.
 */
export function useCurrentUser() {
  const { loggedIn, user, fetch: refreshSession } = useUserSession()
  const offlineUser = useState<User | null>('wayside-offline-user', () => null)
  const current = computed<User | null>(() => (loggedIn.value ? (user.value as User) : offlineUser.value))
  const offline = computed(() => !loggedIn.value && !!offlineUser.value)

  async function resolve(): Promise<User | null> {
    if (loggedIn.value) return user.value as User
    if (!import.meta.client) return null
    // The person remembered here is read beside the request, and with no network at all the
    // request is not even tried: the phone's screens paint without waiting on it.
    const remembered = deviceUser()
    const answer = navigator.onLine === false
      ? 'unreachable' as const
      // The session plugin may have failed for lack of network; ask once more, then fall back.
      : await $fetch<{ user?: User }>('/api/_auth/session', { retry: 0, timeout: 5000 }).catch(() => 'unreachable' as const)
    if (answer === 'unreachable') {
      offlineUser.value = (await remembered) ?? null
      return offlineUser.value
    }
    if (answer.user) {
      await refreshSession()
      return answer.user
    }
    return null
  }

  return { current, offline, resolve }
}
