import { z } from 'zod'

/** A browser's push subscription (`PushSubscription.toJSON()`), as the client sends it. */
export const PushSubscriptionInput = z.object({
  endpoint: z.url('Not a push endpoint.').max(2000),
  keys: z.object({
    p256dh: z.string().regex(/^[\w-]{40,120}$/, 'Not a public key.'),
    auth: z.string().regex(/^[\w-]{16,40}$/, 'Not an auth secret.'),
  }),
})
export type PushSubscriptionInput = z.infer<typeof PushSubscriptionInput>

export const PushEndpoint = z.object({ endpoint: z.url('Not a push endpoint.').max(2000) })

/** The server's VAPID public key, for `PushManager.subscribe`; null where push is not set up. */
export const PushKey = z.object({ publicKey: z.string().nullable() })
export type PushKey = z.infer<typeof PushKey>

/** What a push alert carries to the device: the service worker shows it and opens `url`. */
export const PushPayload = z.object({
  title: z.string(),
  body: z.string(),
  url: z.string(),
  tag: z.string(),
})
export type PushPayload = z.infer<typeof PushPayload>

/** A message the local push stand-in received and decrypted, for admins and tests. */
export const CaughtPush = z.object({
  id: z.number().int(),
  receivedAt: z.iso.datetime(),
  endpoint: z.string(),
  ttl: z.number(),
  topic: z.string().nullable(),
  urgency: z.string().nullable(),
  payload: z.string(),
})
export type CaughtPush = z.infer<typeof CaughtPush>
