import { acceptHMRUpdate, defineStore } from 'pinia'
import { ref, watch, watchEffect } from 'vue'

export type ColorScheme = 'light' | 'dark'

const KEY = 'chopline.colorScheme'

function initialScheme(): ColorScheme {
  const saved = localStorage.getItem(KEY)
  if (saved === 'light' || saved === 'dark') return saved
  return window.matchMedia?.('(prefers-color-scheme: dark)').matches ? 'dark' : 'light'
}

/** Device-level display choices; per-user settings (units, home lake) live on the server. */
export const usePreferencesStore = defineStore('preferences', () => {
  const colorScheme = ref<ColorScheme>(initialScheme())
  watch(colorScheme, (value) => localStorage.setItem(KEY, value))
  // The page's own colours (main.css) follow it; naive-ui's follow through NaiveScope.
  watchEffect(() => (document.documentElement.dataset.colorScheme = colorScheme.value))
  const toggleColorScheme = () => {
    colorScheme.value = colorScheme.value === 'dark' ? 'light' : 'dark'
  }
  return { colorScheme, toggleColorScheme }
})

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(usePreferencesStore, import.meta.hot))
