import { VueQueryPlugin } from '@tanstack/vue-query'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia } from 'pinia'
import { afterEach, describe, expect, it } from 'vitest'
import { createMemoryHistory, createRouter } from 'vue-router'
import type { Role } from '@shared/schemas/auth'
import TheAppShell from '@/components/TheAppShell.vue'
import { useAuthStore } from '@/stores/auth'

const page = { render: () => null }
async function mountShell(role: Role) {
  const router = createRouter({
    history: createMemoryHistory(),
    routes: [{ path: '/:any(.*)*', component: page }],
  })
  await router.push('/lakes')
  const pinia = createPinia()
  useAuthStore(pinia).adopt({
    id: '00000000-0000-4000-8000-00000000000b',
    email: `${role}@example.test`,
    role,
    createdAt: new Date().toISOString(),
  })
  return {
    router,
    wrapper: mount(TheAppShell, {
      attachTo: document.body,
      global: { plugins: [pinia, router, VueQueryPlugin] },
    }),
  }
}

let unmount: (() => void) | undefined
afterEach(() => unmount?.())

describe('TheAppShell', () => {
  it('puts an admin’s links beyond the first three under “More”, a menu that opens and closes', async () => {
    const { wrapper, router } = await mountShell('admin')
    unmount = () => wrapper.unmount()
    const bar = wrapper.findAll('.shell-nav > a')
    expect(bar.filter((a) => !a.classes('phone-more')).map((a) => a.text())).toEqual([
      'Lakes',
      'Journal',
      'Trips',
    ])
    const more = wrapper.get('button.more-button')
    expect(more.attributes('aria-expanded')).toBe('false')
    expect(wrapper.get('#shell-more-menu').isVisible()).toBe(false)

    await more.trigger('click')
    await flushPromises()
    expect(more.attributes('aria-expanded')).toBe('true')
    const menu = wrapper.get('#shell-more-menu')
    expect(menu.findAll('a').map((a) => a.text())).toEqual([
      'Clients',
      'Settings',
      'Users',
      'Stations',
      'Desk lakes',
      'Quarantine',
      'Audit',
      'Mail',
    ])
    // Focus moves into the menu, and Escape brings it back to the button.
    expect(document.activeElement?.textContent?.trim()).toBe('Clients')
    await menu.trigger('keydown', { key: 'Escape' })
    expect(more.attributes('aria-expanded')).toBe('false')
    expect(document.activeElement).toBe(more.element)

    // Going to a page closes it.
    await more.trigger('click')
    await router.push('/admin/audit')
    await flushPromises()
    expect(more.attributes('aria-expanded')).toBe('false')
  })

  it('has no “More” for an angler, whose three links always fit', async () => {
    const { wrapper } = await mountShell('angler')
    unmount = () => wrapper.unmount()
    expect(wrapper.findAll('.shell-nav > a').map((a) => a.text())).toEqual([
      'Lakes',
      'Journal',
      'Settings',
    ])
    expect(wrapper.find('button.more-button').exists()).toBe(false)
  })
})
