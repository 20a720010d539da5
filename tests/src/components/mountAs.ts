import { QueryClient, VueQueryPlugin } from '@tanstack/vue-query'
import { mount } from '@vue/test-utils'
import { createPinia } from 'pinia'
import type { Component } from 'vue'
import { settingsQuery } from '@/api/settings'
import type { Role } from '@shared/schemas/auth'
import type { Settings } from '@shared/schemas/settings'
import { useAuthStore } from '@/stores/auth'

export { IMPERIAL, METRIC } from '../../helpers/units'

/**
 * Mounts a component for a signed-in user with these settings, as the app has them: the user in
 * the auth store and the settings in the query cache under `settingsQuery`, so `useFormat()` reads
 * them exactly as on a page. Nothing is fetched.
 */
export function mountAs(
  settings: Settings,
  component: Component,
  options: {
    props?: Record<string, unknown>
    role?: Role
    stubs?: Record<string, boolean | Component>
  } = {},
) {
  const pinia = createPinia()
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false } } })
  queryClient.setQueryData(settingsQuery.queryKey, settings)
  useAuthStore(pinia).adopt({
    id: '00000000-0000-4000-8000-00000000000a',
    email: 'angler@example.test',
    role: options.role ?? 'angler',
    createdAt: new Date().toISOString(),
  })
  return mount(component, {
    props: options.props,
    global: {
      plugins: [pinia, [VueQueryPlugin, { queryClient }]],
      stubs: options.stubs,
    },
  })
}
