import { apiCommand, apiRequest, ApiError } from '@/api/http'
import type { PushKey } from '@shared/schemas/push'

/** Whether this browser can take push alerts at all. */
export function pushSupported(): boolean {
  return 'serviceWorker' in navigator && 'PushManager' in window && 'Notification' in window
}

/** A VAPID key as PushManager takes it (base64url to bytes). */
function keyBytes(base64url: string): Uint8Array<ArrayBuffer> {
  const base64 = base64url.replace(/-/g, '+').replace(/_/g, '/')
  const raw = atob(base64 + '='.repeat((4 - (base64.length % 4)) % 4))
  const bytes = new Uint8Array(new ArrayBuffer(raw.length))
  for (let i = 0; i < raw.length; i++) bytes[i] = raw.charCodeAt(i)
  return bytes
}

/**
 * Subscribes this device to watch alerts: asks permission, subscribes with the server's VAPID
 * key (`GET /api/push/key`) through the service worker, and gives the server the subscription
 * (`PUT /api/me/push`). Throws an ApiError with words for a person when it cannot.
 */
export async function subscribeThisDevice(): Promise<void> {
  if (!pushSupported())
    throw new ApiError(0, 'no_push', 'This browser cannot show alerts. Watches still send e-mail.')
  const { publicKey } = await apiRequest<PushKey>('/push/key')
  if (!publicKey)
    throw new ApiError(404, 'no_push', 'This server does not send push alerts; e-mail still works.')
  if ((await Notification.requestPermission()) !== 'granted')
    throw new ApiError(
      0,
      'push_denied',
      'Alerts are blocked for this site. Allow notifications in the browser to get them here.',
    )
  const registration = await navigator.serviceWorker.ready
  const subscription =
    (await registration.pushManager.getSubscription()) ??
    (await registration.pushManager.subscribe({
      userVisibleOnly: true,
      applicationServerKey: keyBytes(publicKey),
    }))
  await apiCommand('/me/push', { method: 'PUT', body: subscription.toJSON() })
}
