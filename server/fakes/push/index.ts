import { createECDH, randomBytes, randomUUID } from 'node:crypto'
import { createServer, type IncomingMessage } from 'node:http'
import type { AddressInfo } from 'node:net'
import { decrypt } from 'http_ece'
import { decodeJwt } from 'jose'
import type { CaughtPush } from '../../../shared/schemas/push'

/** A browser's subscription as the app stores it. */
export interface FakeSubscription {
  endpoint: string
  keys: { p256dh: string; auth: string }
}

/**
 * The local stand-in for a browser push service: hands out subscriptions (a P-256 key pair and an
 * auth secret per device, as a browser makes), takes Web Push requests for them on 127.0.0.1,
 * checks the VAPID header names this origin, decrypts the aes128gcm body and keeps the latest
 * `keep` messages for tests and the admins' list. `expire(endpoint)` makes it answer 410 Gone.
 */
export async function startPushServer(opts: { port?: number; keep?: number } = {}) {
  const keep = opts.keep ?? 500
  const devices = new Map<string, { ecdh: ReturnType<typeof createECDH>; auth: Buffer }>()
  const gone = new Set<string>()
  const caught: CaughtPush[] = []
  let nextId = 1
  let origin = ''

  const body = async (req: IncomingMessage) => {
    const chunks: Buffer[] = []
    for await (const chunk of req) chunks.push(chunk as Buffer)
    return Buffer.concat(chunks)
  }

  const server = createServer((req, res) => {
    const answer = (status: number, text = '') => res.writeHead(status).end(text)
    const match = /^\/push\/([\w-]+)$/.exec(req.url ?? '')
    if (req.method !== 'POST' || !match) return answer(404)
    const id = match[1]!
    void body(req).then((data) => {
      if (gone.has(id)) return answer(410, 'Subscription expired')
      const device = devices.get(id)
      if (!device) return answer(404, 'No such subscription')
      // VAPID (RFC 8292): "vapid t=<JWT for this origin>, k=<the server's public key>".
      const vapid = /^vapid t=([^,]+),\s*k=(.+)$/.exec(req.headers.authorization ?? '')
      if (!vapid) return answer(401, 'VAPID authorization required')
      let aud: unknown
      try {
        aud = decodeJwt(vapid[1]!).aud
      } catch {
        return answer(401, 'Malformed VAPID token')
      }
      if (aud !== origin) return answer(403, 'VAPID audience is not this push service')
      if (req.headers['content-encoding'] !== 'aes128gcm')
        return answer(415, 'Only aes128gcm payloads')
      let payload: string
      try {
        payload = decrypt(data, {
          version: 'aes128gcm',
          privateKey: device.ecdh,
          authSecret: device.auth,
        }).toString('utf8')
      } catch {
        return answer(400, 'Payload does not decrypt')
      }
      caught.unshift({
        id: nextId++,
        receivedAt: new Date().toISOString(),
        endpoint: `${origin}/push/${id}`,
        ttl: Number(req.headers.ttl ?? 0),
        topic: typeof req.headers.topic === 'string' ? req.headers.topic : null,
        urgency: typeof req.headers.urgency === 'string' ? req.headers.urgency : null,
        payload,
      })
      caught.length = Math.min(caught.length, keep)
      answer(201)
    })
  })
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(opts.port ?? 0, '127.0.0.1', () => resolve())
  })
  origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}`

  return {
    url: origin,
    /** A new device's subscription, as `PushManager.subscribe` would give it. */
    subscribe(): FakeSubscription {
      const id = randomUUID()
      const ecdh = createECDH('prime256v1')
      ecdh.generateKeys()
      const auth = randomBytes(16)
      devices.set(id, { ecdh, auth })
      return {
        endpoint: `${origin}/push/${id}`,
        keys: {
          p256dh: ecdh.getPublicKey().toString('base64url'),
          auth: auth.toString('base64url'),
        },
      }
    },
    /** From now on the push service answers 410 Gone for this subscription. */
    expire(endpoint: string) {
      gone.add(endpoint.split('/').pop()!)
    },
    /** Newest first. */
    messages: (): readonly CaughtPush[] => caught,
    clear: () => {
      caught.length = 0
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  }
}
export type PushServer = Awaited<ReturnType<typeof startPushServer>>
