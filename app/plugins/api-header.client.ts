// Every request from the browser carries X-Wayside, which the server demands on state changes
// (a form on another site cannot add it). useFetch and $fetch both go through globalThis.$fetch.
export default defineNuxtPlugin(() => {
  const base = globalThis.$fetch
  globalThis.$fetch = base.create({
    onRequest({ options }) {
      const headers = new Headers(options.headers as HeadersInit | undefined)
      headers.set('X-Wayside', '1')
      options.headers = headers
    },
  }) as typeof base
})
