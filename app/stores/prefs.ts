import { acceptHMRUpdate, defineStore } from 'pinia'

export type Theme = 'sunlight' | 'night'

/** Small preferences of this device; records never live here (they are in IndexedDB). */
export const usePrefsStore = defineStore('prefs', () => {
  const theme = ref<Theme>('sunlight')
  const temperatureUnit = ref<'degC' | 'degF'>('degC')
  const pressureUnit = ref<'kPa' | 'psi'>('kPa')
  const resistanceUnit = ref<'ohm' | 'kohm'>('ohm')
  const voltageUnit = ref<'V' | 'mV'>('V')
  const distanceUnit = ref<'km' | 'mi'>('km')
  /** Whether the mechanic agreed to send their position when syncing; asked once. */
  const positionConsent = ref<'unasked' | 'yes' | 'no'>('unasked')

  function toggleTheme() {
    theme.value = theme.value === 'night' ? 'sunlight' : 'night'
  }

  return { theme, temperatureUnit, pressureUnit, resistanceUnit, voltageUnit, distanceUnit, positionConsent, toggleTheme }
}, {
  // A cookie, so the server renders the chosen theme and the page never flashes the other one.
  persist: { storage: piniaPluginPersistedstate.cookies({ maxAge: 60 * 60 * 24 * 365, sameSite: 'lax' }) },
})

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(usePrefsStore, import.meta.hot))
