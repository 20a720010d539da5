import { registerSW } from 'virtual:pwa-register'
import { watch } from 'vue'
import type { Router } from 'vue-router'
import { keepForTheRamp } from './keep'
import { online } from './network'

/** Checking for a new build this often while the app stays open; also whenever the network returns. */
const UPDATE_CHECK_MS = 30 * 60_000

/**
 * Registers the service worker (src/sw/sw.ts). A new build takes over as soon as it is installed
 * and the page reloads itself onto it (registerType 'autoUpdate'): nobody clears anything. Once
 * the worker controls the page, and after each navigation while signed in, the answers needed at
 * the ramp are read so it keeps them (see keepForTheRamp).
 */
export function registerServiceWorker(router: Router, signedIn: () => boolean) {
  if (!('serviceWorker' in navigator)) return
  const keep = () => {
    if (signedIn()) void keepForTheRamp()
  }
  registerSW({
    immediate: true,
    onRegisteredSW(_url, registration) {
      if (!registration) return
      const check = () => {
        if (navigator.onLine) void registration.update().catch(() => undefined)
      }
      setInterval(check, UPDATE_CHECK_MS)
      watch(online, (now) => {
        if (!now) return
        check()
        keep()
      })
    },
  })
  if (navigator.serviceWorker.controller) keep()
  else navigator.serviceWorker.addEventListener('controllerchange', keep, { once: true })
  router.afterEach(keep)
}
