import { useQuery } from '@tanstack/vue-query'
import { storeToRefs } from 'pinia'
import { computed } from 'vue'
import { settingsQuery } from '@/api/settings'
import { DEFAULT_SETTINGS, makeFormat } from '@shared/format'
import { useAuthStore } from '@/stores/auth'

/** The signed-in user's settings from the server (defaults until they arrive or when signed out). */
export function useSettings() {
  const { signedIn } = storeToRefs(useAuthStore())
  const query = useQuery({ ...settingsQuery, enabled: signedIn })
  return computed(() => query.data.value ?? DEFAULT_SETTINGS)
}

/** Formatters in the user's units, for templates: `f.temp(c)`, `f.speed(ms)`. */
export function useFormat() {
  const settings = useSettings()
  return computed(() => makeFormat(settings.value))
}
