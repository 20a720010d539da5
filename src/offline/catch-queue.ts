import { createStore, del, get, set, values } from 'idb-keyval'
import { ref, watch } from 'vue'
import type { CatchInput } from '@shared/schemas/journal'
import { ApiError } from '@/api/http'
import { journalApi, journalKeys } from '@/api/journal'
import { queryClient } from '@/queryClient'
import { online } from './network'

/**
 * Catches logged with no network, kept on the phone (IndexedDB, through idb-keyval) until they
 * are sent. Each carries the id the phone gave it (`clientId`): the server logs a catch once per
 * id, so a send whose answer was lost, a reload mid-send or two open tabs never log a fish twice.
 * A catch leaves the phone only once the server has answered that it is logged.
 */
export interface QueuedCatch {
  clientId: string
  /** Whose catch it is: only they send it (another person may sign in on the same phone). */
  userId: string
  /** The catch as the form made it, with `clientId`. */
  input: CatchInput & { clientId: string }
  /** The photo picked offline, sent first; null once it is uploaded (then `input.photoId`). */
  photo: File | null
  queuedAt: number
  /** Why the server refused it (a 4xx): it stays, for the angler to see and discard. */
  problem: string | null
}

const store = () => createStore('chopline-catches', 'waiting')

/** The signed-in angler's catches waiting on this phone, oldest first. */
export const queuedCatches = ref<QueuedCatch[]>([])

async function load(userId: string) {
  const all = (await values<QueuedCatch>(store())).filter((q) => q.userId === userId)
  queuedCatches.value = all.sort((a, b) => a.queuedAt - b.queuedAt)
}

/** Keeps a catch on the phone to be sent when the network is back. */
async function keepCatch(
  userId: string,
  input: CatchInput & { clientId: string },
  photo: File | null,
) {
  const queued: QueuedCatch = {
    clientId: input.clientId,
    userId,
    input,
    photo,
    queuedAt: Date.now(),
    problem: null,
  }
  await set(input.clientId, queued, store())
  await load(userId)
}

/** Drops a catch the server refused, once its angler has read why. */
export async function discardCatch(userId: string, clientId: string) {
  await del(clientId, store())
  await load(userId)
}

/** The server said no (bad input): sending it again would answer the same. */
const refused = (err: unknown) =>
  err instanceof ApiError &&
  err.status >= 400 &&
  err.status < 500 &&
  ![401, 408, 429].includes(err.status)

async function sendOne(q: QueuedCatch) {
  let input = q.input
  if (q.photo) {
    const up = await journalApi.uploadPhoto(q.photo, input.lakeSlug)
    input = { ...input, photoId: up.id }
    // Kept before the catch is sent: a retry attaches this upload rather than another.
    await set(q.clientId, { ...q, input, photo: null }, store())
  }
  await journalApi.create(input)
  await del(q.clientId, store())
}

/**
 * Logs a catch now when there is a network, or keeps it on the phone when there is none (or the
 * send fails on the way there), to be sent when the network is back. A photo picked offline comes
 * as `photo` and is uploaded first. Answers whether the catch was logged or kept.
 */
export async function logCatch(
  userId: string,
  input: CatchInput & { clientId: string },
  photo: File | null,
): Promise<'logged' | 'kept'> {
  let sent = input
  if (online.value) {
    try {
      if (photo)
        sent = { ...sent, photoId: (await journalApi.uploadPhoto(photo, input.lakeSlug)).id }
      await journalApi.create(sent)
      await queryClient.invalidateQueries({ queryKey: journalKeys.all })
      return 'logged'
    } catch (err) {
      if (!(err instanceof ApiError) || err.code !== 'offline') throw err
    }
  }
  await keepCatch(userId, sent, sent.photoId ? null : photo)
  return 'kept'
}

let sending: Promise<void> | null = null

/**
 * Sends the angler's waiting catches, oldest first, one send at a time. A network failure or a
 * server error stops the round (the next one comes with the network); a refusal is kept with its
 * message.
 */
function sendQueuedCatches(userId: string): Promise<void> {
  sending ??= (async () => {
    try {
      const waiting = (await values<QueuedCatch>(store()))
        .filter((q) => q.userId === userId && !q.problem)
        .sort((a, b) => a.queuedAt - b.queuedAt)
      let sent = 0
      for (const q of waiting) {
        if (!online.value) break
        try {
          await sendOne(q)
          sent++
        } catch (err) {
          if (!refused(err)) break
          const latest = (await get<QueuedCatch>(q.clientId, store())) ?? q
          await set(q.clientId, { ...latest, problem: (err as Error).message }, store())
        }
      }
      await load(userId)
      if (sent) await queryClient.invalidateQueries({ queryKey: journalKeys.all })
    } finally {
      sending = null
    }
  })()
  return sending
}

/** While catches wait and the browser says it is online (one bar at the ramp), trying again this often. */
const RETRY_MS = 60_000

/**
 * Keeps the signed-in angler's waiting catches in `queuedCatches` and sends them whenever the
 * network is there: now, when it returns, when someone signs in, and every minute while some
 * wait with the browser online (a send that failed on a weak signal).
 */
export function sendWhenOnline(userId: () => string | null) {
  if (typeof indexedDB === 'undefined') return
  watch(
    [online, userId],
    ([now, who]) => {
      if (!who) {
        queuedCatches.value = []
        return
      }
      void load(who).then(() => (now ? sendQueuedCatches(who) : undefined))
    },
    { immediate: true },
  )
  setInterval(() => {
    const who = userId()
    if (who && online.value && queuedCatches.value.some((q) => !q.problem))
      void sendQueuedCatches(who)
  }, RETRY_MS)
}
