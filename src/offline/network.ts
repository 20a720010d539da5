import { onlineManager } from '@tanstack/vue-query'
import { reactive, ref } from 'vue'

/**
 * Whether the device has a network, as the browser says (`navigator.onLine` and its `online` and
 * `offline` events), for the page's marks and forms, and told to the query cache: queries refetch
 * when it comes back (TanStack Query's refetch on reconnect).
 */
export const online = ref(typeof navigator === 'undefined' ? true : navigator.onLine)

let watching = false
export function watchNetwork() {
  if (watching || typeof window === 'undefined') return
  watching = true
  const set = (value: boolean) => {
    online.value = value
    onlineManager.setOnline(value)
  }
  set(navigator.onLine)
  window.addEventListener('online', () => set(true))
  window.addEventListener('offline', () => set(false))
}

/**
 * When the server answered each GET the page has read (its `Date` header), by API path: an answer
 * the service worker kept is dated when the server gave it, so offline this is when it was saved.
 */
export const answeredAt = reactive(new Map<string, number>())

export function noteAnswer(path: string, res: Response) {
  const date = Date.parse(res.headers.get('date') ?? '')
  answeredAt.set(path, Number.isFinite(date) ? date : Date.now())
}
