import { randomUUID } from 'node:crypto'
import { LRUCache } from 'lru-cache'
import pg from 'pg'
import type { Logger } from '../logger'

/** The channel drizzle/0010_change_notices.sql notifies on: "table:key" per changed row. */
const CHANNEL = 'chopline_changes'

export interface Change {
  table: string
  key: string
}

/**
 * The database's change notices, for answers kept in memory. While the listening connection is
 * down nothing may be answered from memory (`live` is false), and every reconnect counts as a
 * change to everything, since notices may have been missed meanwhile.
 */
export interface Changes {
  readonly live: boolean
  /** Moves on every notice and every reconnect; an answer is kept only if it did not move while
   *  the answer was read. */
  readonly version: number
  /** Called with each notice, and with null when everything must go (a reconnect). */
  subscribe(listener: (change: Change | null) => void): void
  /**
   * Resolves once every notice of a commit made before the call has been heard. PostgreSQL sends
   * a listening connection its pending notices before the answer to any later query on it, so a
   * round trip there is the barrier; callers that ask while one is under way share the next.
   */
  heard(): Promise<void>
  close(): Promise<void>
}

export function watchChanges(config: pg.ClientConfig, log: Logger, retryMs = 1_000): Changes {
  const listeners: ((change: Change | null) => void)[] = []
  let live = false
  let version = 0
  let closed = false
  let client: pg.Client | null = null

  const emit = (change: Change | null) => {
    version++
    for (const listener of listeners) listener(change)
  }

  async function connect() {
    const c = new pg.Client(config)
    client = c
    // Live only once a notice of our own comes back: a connection that cannot receive them (a
    // transaction-pooling proxy accepts LISTEN and then delivers nothing) never turns caching on.
    const ping = `ping:${randomUUID()}`
    c.on('notification', ({ payload = '' }) => {
      if (payload === ping) {
        emit(null)
        live = true
        return
      }
      const at = payload.indexOf(':')
      emit({ table: payload.slice(0, at), key: payload.slice(at + 1) })
    })
    c.on('error', (err) => lost(c, err))
    c.on('end', () => lost(c))
    try {
      await c.connect()
      await c.query(`LISTEN ${CHANNEL}`)
      await c.query('select pg_notify($1, $2)', [CHANNEL, ping])
    } catch (err) {
      lost(c, err)
    }
  }

  function lost(c: pg.Client, err?: unknown) {
    if (client !== c) return
    client = null
    live = false
    emit(null)
    c.end().catch(() => undefined)
    if (closed) return
    log.warn({ err }, 'change notices lost: answering from the database until they are back')
    setTimeout(() => void connect(), retryMs).unref()
  }

  /** The barrier on the wire, and the one callers who came after it was sent will share. */
  let sent: Promise<void> | null = null
  let next: Promise<void> | null = null
  const roundTrip = async () => {
    // A connection lost meanwhile turns `live` off, and callers read the database then.
    await client?.query('select 1').catch(() => undefined)
  }
  function heard(): Promise<void> {
    if (!sent) {
      sent = roundTrip().finally(() => (sent = null))
      return sent
    }
    next ??= sent.then(() => {
      next = null
      return heard()
    })
    return next
  }

  void connect()
  return {
    heard,
    get live() {
      return live
    },
    get version() {
      return version
    },
    subscribe: (listener) => void listeners.push(listener),
    async close() {
      closed = true
      live = false
      const c = client
      client = null
      await c?.end()
    },
  }
}

/**
 * Answers made from the database, kept in memory while change notices are live and dropped by
 * `forget` when a notice says what they were made from has changed. Without notices (`changes`
 * absent or down) every call reads the database.
 */
export class NoticedCache<V extends object> {
  private readonly kept: LRUCache<string, V>
  /** Loads under way, with the notice version each began at. */
  private readonly loading = new Map<string, { version: number; value: Promise<V> }>()

  constructor(
    private readonly changes: Changes | undefined,
    options: LRUCache.Options<string, V, unknown>,
    forget: (change: Change, kept: LRUCache<string, V>) => void,
  ) {
    this.kept = new LRUCache(options)
    changes?.subscribe((change) => (change ? forget(change, this.kept) : this.kept.clear()))
  }

  /** Drops one kept answer (one the clock has made wrong). */
  delete(key: string) {
    this.kept.delete(key)
  }

  /**
   * The kept answer, or one load shared by every caller that asks while it runs (after a refresh
   * empties the cache, a burst of views makes one answer, not one each). A caller that asks after
   * a notice starts a load of its own, as the running one may have read what the notice changed.
   */
  async get(key: string, load: () => Promise<V>): Promise<V> {
    const changes = this.changes
    if (!changes?.live) return load()
    // A change committed through another instance just before this call has been heard, so what
    // is kept reflects it ("at once", not "a few milliseconds later").
    await changes.heard()
    if (!changes.live) return load()
    const kept = this.kept.get(key)
    if (kept) return kept
    const version = changes.version
    const running = this.loading.get(key)
    if (running?.version === version) return running.value
    const value = load()
    this.loading.set(key, { version, value })
    try {
      const loaded = await value
      // A notice that came while loading may be about what was just read: keep nothing then.
      if (changes.live && changes.version === version) this.kept.set(key, loaded)
      return loaded
    } finally {
      if (this.loading.get(key)?.value === value) this.loading.delete(key)
    }
  }
}
