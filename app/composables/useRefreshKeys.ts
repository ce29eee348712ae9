/**
 * Refreshes useFetch data by key at once. `refreshNuxtData` first waits for an idle moment
 * (requestIdleCallback), which may be long in coming after keyboard input: in headless Chromium
 * it never came after a Tab. After a person's own action the app is hydrated, so no wait is needed.
 * Call in setup; use the returned function in handlers.
 */
export function useRefreshKeys() {
  const nuxtApp = useNuxtApp()
  return (keys: string | string[]) => nuxtApp.hooks.callHookParallel('app:data:refresh', Array.isArray(keys) ? keys : [keys])
}
