// A phone screen opened cold (with no signal above all) reads the calls kept on the phone from the
// start, beside the session request and the page's own files rather than after them; the first
// screen that asks takes that read (app/utils/deviceRead.ts).
export default defineNuxtPlugin({
  name: 'wayside-device-read',
  enforce: 'pre',
  setup() {
    const path = window.location.pathname
    if (path === '/m' || path.startsWith('/m/')) readDeviceListsEarly()
  },
})
