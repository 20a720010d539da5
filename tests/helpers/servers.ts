import { spawn, type ChildProcess } from 'node:child_process'
import { setTimeout as sleep } from 'node:timers/promises'
import { fileURLToPath } from 'node:url'
import { freePort } from '../setup/postgres'

const root = fileURLToPath(new URL('../..', import.meta.url))

/** Polls `check` until it returns something other than undefined/false, or throws at the deadline. */
export async function until<T>(
  what: string,
  check: () => Promise<T | undefined | false> | T | undefined | false,
  { timeoutMs = 20_000, everyMs = 100 } = {},
): Promise<T> {
  const deadline = Date.now() + timeoutMs
  let last: unknown
  for (;;) {
    try {
      const value = await check()
      if (value !== undefined && value !== false) return value
    } catch (err) {
      last = err
    }
    if (Date.now() > deadline)
      throw new Error(`timed out waiting for ${what}${last ? `: ${String(last)}` : ''}`)
    await sleep(everyMs)
  }
}

export interface ServerProcess {
  name: string
  url: string
  pid: number
  child: ChildProcess
  /** The process's log lines (pino JSON), parsed. */
  logs: () => Record<string, unknown>[]
  /** Whether the process has exited. */
  exited: () => boolean
  kill: (signal?: NodeJS.Signals) => Promise<void>
}

/**
 * The production entry (`server/index.ts`, as `tsx server/index.ts` runs it) in a process of its
 * own on a free port, with `env` on top of this one's; resolves once `/api/health` answers 200.
 */
export async function startServerProcess(
  name: string,
  env: Record<string, string>,
): Promise<ServerProcess> {
  const port = await freePort()
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: root,
    env: { ...process.env, NODE_ENV: 'test', HOST: '127.0.0.1', PORT: String(port), ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  const lines: string[] = []
  let rest = ''
  child.stdout.setEncoding('utf8').on('data', (chunk: string) => {
    const parts = (rest + chunk).split('\n')
    rest = parts.pop()!
    lines.push(...parts)
  })
  let stderr = ''
  child.stderr.setEncoding('utf8').on('data', (chunk: string) => (stderr += chunk))
  let exited = false
  const exit = new Promise<void>((resolve) =>
    child.once('exit', () => {
      exited = true
      resolve()
    }),
  )
  const url = `http://127.0.0.1:${port}`
  await until(
    `${name} to answer /api/health`,
    async () => {
      if (exited) throw new Error(`${name} exited: ${stderr}`)
      return (await fetch(`${url}/api/health`)).ok
    },
    { timeoutMs: 45_000, everyMs: 200 },
  )
  return {
    name,
    url,
    pid: child.pid!,
    child,
    logs: () =>
      lines.flatMap((line) => {
        try {
          return [JSON.parse(line) as Record<string, unknown>]
        } catch {
          return []
        }
      }),
    exited: () => exited,
    kill: async (signal = 'SIGTERM') => {
      if (exited) return
      child.kill(signal)
      await exit
    },
  }
}

/**
 * A signed-in browser's view of the API on any of the servers given: one session cookie, sent to
 * whichever server a request goes to, and the app's origin on every request.
 */
export function apiClient(origin: string) {
  let cookie = ''
  return async function api(
    server: { url: string },
    method: string,
    path: string,
    body?: unknown,
  ): Promise<{ status: number; body: unknown }> {
    const res = await fetch(`${server.url}${path}`, {
      method,
      headers: {
        origin,
        cookie,
        ...(body === undefined ? {} : { 'content-type': 'application/json' }),
      },
      body: body === undefined ? undefined : JSON.stringify(body),
    })
    const set = res.headers.getSetCookie().map((c) => c.split(';')[0])
    if (set.length) cookie = set.join('; ')
    const text = await res.text()
    let parsed: unknown = text
    try {
      parsed = JSON.parse(text)
    } catch {
      // not JSON: kept as text
    }
    return { status: res.status, body: parsed }
  }
}
export type ApiClient = ReturnType<typeof apiClient>
