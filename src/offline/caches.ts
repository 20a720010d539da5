/**
 * What the service worker keeps for reading with no network, shared by the worker (src/sw/) and
 * the page (which empties it on sign-out). No DOM or worker types here: both import it.
 */

/** Every API cache's name starts so; the rest names the build, so builds never share answers. */
export const API_CACHE_PREFIX = 'chopline-api-'

/**
 * The GET answers kept for the ramp: who is signed in and their settings (the shell asks before
 * any page), the followed lakes, each lake's read, Day plans, banks and outline, and a shared trip with its catches.
 */
const OFFLINE_READABLE = [
  /^\/api\/me$/,
  /^\/api\/me\/settings$/,
  /^\/api\/lakes$/,
  /^\/api\/lakes\/[^/]+\/read$/,
  /^\/api\/lakes\/[^/]+\/plan\/\d{4}-\d{2}-\d{2}$/,
  /^\/api\/lakes\/[^/]+\/banks$/,
  /^\/api\/lakes\/[^/]+\/shoreline$/,
  /^\/api\/shared\/trips\/[^/]+$/,
  /^\/api\/shared\/trips\/[^/]+\/catches$/,
]

export function isOfflineReadable(pathname: string): boolean {
  return OFFLINE_READABLE.some((re) => re.test(pathname))
}

/**
 * The API cache's name for a build, from its precache manifest (every asset's revision): a new
 * build's worker reads none of the answers an older build kept, and deletes them when it takes over.
 */
export function apiCacheName(
  entries: ReadonlyArray<string | { url: string; revision?: string | null }>,
) {
  // FNV-1a over the manifest: short, stable, and enough to tell builds apart.
  let hash = 0x811c9dc5
  for (const e of entries) {
    const s = typeof e === 'string' ? e : `${e.url}@${e.revision ?? ''}`
    for (let i = 0; i < s.length; i++) hash = Math.imul(hash ^ s.charCodeAt(i), 0x01000193)
  }
  return `${API_CACHE_PREFIX}${(hash >>> 0).toString(36)}`
}
