import { API_CACHE_PREFIX } from './caches'

/** Deletes every API answer the service worker kept (on sign-out: they were that person's). */
export async function forgetOfflineAnswers() {
  if (typeof caches === 'undefined') return
  const names = await caches.keys().catch(() => [])
  await Promise.all(
    names.filter((n) => n.startsWith(API_CACHE_PREFIX)).map((n) => caches.delete(n)),
  )
}
