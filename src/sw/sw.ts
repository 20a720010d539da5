/**
 * The service worker, built by vite-plugin-pwa (injectManifest) with Workbox. The app shell (every
 * built asset and index.html) is precached; pages come from the network, or, with none, the
 * precached shell, which then asks the API; the API answers a page needs to be read at the ramp
 * (see isOfflineReadable) come from the network within a few seconds, else from the last answer
 * kept. A new build takes over at once (the page reloads; see src/offline/register.ts) and drops
 * the answers the old one kept.
 */
import { CacheableResponsePlugin } from 'workbox-cacheable-response'
import { clientsClaim } from 'workbox-core'
import { ExpirationPlugin } from 'workbox-expiration'
import { cleanupOutdatedCaches, matchPrecache, precacheAndRoute } from 'workbox-precaching'
import { NavigationRoute, registerRoute } from 'workbox-routing'
import { NetworkFirst, NetworkOnly } from 'workbox-strategies'
import { API_CACHE_PREFIX, apiCacheName, isOfflineReadable } from '../offline/caches'

declare const self: ServiceWorkerGlobalScope

const manifest = self.__WB_MANIFEST
const apiCache = apiCacheName(manifest)
/** One bar at the ramp: wait this long for the network before showing what was kept. */
const NETWORK_TIMEOUT_S = 4

void self.skipWaiting()
clientsClaim()

// Pages first, before the precache's route: online, index.html comes from the server with the
// page's boot data; with no network, the precached shell.
const pages = new NetworkOnly({ networkTimeoutSeconds: NETWORK_TIMEOUT_S })
registerRoute(
  new NavigationRoute(
    async (options) => {
      try {
        return await pages.handle(options)
      } catch {
        return (await matchPrecache('/index.html')) ?? Response.error()
      }
    },
    { denylist: [/^\/api\//] },
  ),
)

precacheAndRoute(manifest)
cleanupOutdatedCaches()

registerRoute(
  ({ url, request, sameOrigin }) =>
    sameOrigin && request.method === 'GET' && isOfflineReadable(url.pathname),
  new NetworkFirst({
    cacheName: apiCache,
    networkTimeoutSeconds: NETWORK_TIMEOUT_S,
    plugins: [
      // Only whole answers: never an error or a 304 without its body.
      new CacheableResponsePlugin({ statuses: [200] }),
      new ExpirationPlugin({ maxEntries: 300, maxAgeSeconds: 14 * 24 * 3600 }),
    ],
  }),
  'GET',
)

self.addEventListener('activate', (event) => {
  event.waitUntil(
    caches
      .keys()
      .then((names) =>
        Promise.all(
          names
            .filter((n) => n.startsWith(API_CACHE_PREFIX) && n !== apiCache)
            .map((n) => caches.delete(n)),
        ),
      ),
  )
})

// Watch alerts by Web Push (PushPayload in shared/schemas/push.ts): shown, and opened on a tap.
self.addEventListener('push', (event) => {
  const alert = (event.data?.json() ?? null) as {
    title: string
    body: string
    url: string
    tag: string
  } | null
  if (!alert) return
  event.waitUntil(
    self.registration.showNotification(alert.title, {
      body: alert.body,
      tag: alert.tag,
      icon: '/icons/icon-192.png',
      data: { url: alert.url },
    }),
  )
})

self.addEventListener('notificationclick', (event) => {
  event.notification.close()
  const url = (event.notification.data as { url?: string } | null)?.url ?? '/watches'
  event.waitUntil(self.clients.openWindow(url))
})
