import { createHash } from 'node:crypto'
import { request } from 'undici'
import webpush from 'web-push'
import type { PushPayload } from '../../../shared/schemas/push'
import type { Db } from '../../db/index'
import type { Logger } from '../../logger'
import { pushRepo } from './push.repo'
import { ChannelError, type ChannelSender } from './send-alerts'

/** The server's VAPID key pair (RFC 8292) and who runs it (a mailto: or https: URL). */
export interface Vapid {
  publicKey: string
  privateKey: string
  subject: string
}

export function generateVapid(subject: string): Vapid {
  return { ...webpush.generateVAPIDKeys(), subject }
}

/** An alert is about a forecast: a push that waits longer than this is no longer news. */
const TTL_S = 6 * 3600

/**
 * Web Push to every device of the alert's owner. A device the push service calls gone (404, 410)
 * is dropped; a refusal that may pass (429, 5xx, no answer) fails the channel for a retry.
 */
export function webPushSender(deps: { db: Db; log: Logger; vapid: Vapid }): ChannelSender {
  const repo = pushRepo(deps.db)
  return async (alert, view) => {
    const devices = await repo.forUser(alert.userId)
    if (!devices.length) return false
    const payload: PushPayload = {
      title: view.heading,
      body: `${view.intro} ${view.lines.join('; ')}`,
      url: view.url,
      tag: `watch-${alert.watchId}-${alert.date}-${alert.windowId}`,
    }
    // One topic per alert: a push service holding an undelivered copy replaces it, never doubles it.
    const topic = createHash('sha256').update(payload.tag).digest('base64url').slice(0, 32)
    let delivered = false
    const errors: string[] = []
    let temporary = false
    for (const device of devices) {
      let status = 0
      let reason: string
      try {
        // web-push signs (VAPID) and encrypts (aes128gcm); undici sends, as the feed client does.
        const push = webpush.generateRequestDetails(
          { endpoint: device.endpoint, keys: { p256dh: device.p256dh, auth: device.auth } },
          JSON.stringify(payload),
          { vapidDetails: deps.vapid, TTL: TTL_S, topic, urgency: 'normal' },
        )
        const res = await request(push.endpoint, {
          method: 'POST',
          headers: push.headers as Record<string, string>,
          body: push.body ?? undefined,
          headersTimeout: 10_000,
          bodyTimeout: 10_000,
        })
        reason = await res.body.text()
        status = res.statusCode
      } catch (err) {
        reason = (err as Error).message
      }
      if (status >= 200 && status < 300) delivered = true
      else {
        if (status === 404 || status === 410) {
          await repo.drop(device.endpoint)
          deps.log.info({ userId: alert.userId }, 'push subscription gone; dropped')
        } else {
          temporary ||= status === 0 || status === 429 || status >= 500
          errors.push(`push ${status || 'unreachable'}: ${reason.slice(0, 200)}`)
        }
      }
    }
    // Told on one device is told; a device that refused for now is not worth a second alert.
    if (!delivered && errors.length) throw new ChannelError(errors.join('; '), !temporary)
    return delivered
  }
}
