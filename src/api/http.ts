import type { ApiErrorBody } from '@shared/schemas/errors'
import { noteAnswer } from '@/offline/network'

/** A failed API call, carrying the server's code and per-field messages. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: Record<string, string> = {},
  ) {
    super(message)
    this.name = 'ApiError'
  }
}

interface RequestOptions {
  method?: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE'
  body?: unknown
  query?: Record<string, string | number | undefined>
}

/**
 * One way to call the API: same-origin cookies, JSON both ways, the answer typed by its shared
 * schema (`apiRequest<LakeRead>(...)`). The client does not parse answers again: the server's API
 * tests parse them with those schemas, and zod stays out of the code a page needs first.
 */
export async function apiRequest<T>(path: string, opts: RequestOptions = {}): Promise<T> {
  const res = await send(path, opts)
  return (await res.json()) as T
}

/** For endpoints that answer 204 No Content. */
export async function apiCommand(path: string, opts: RequestOptions = {}): Promise<void> {
  await send(path, { method: 'POST', ...opts })
}

async function send(path: string, opts: RequestOptions): Promise<Response> {
  const params = new URLSearchParams()
  for (const [k, v] of Object.entries(opts.query ?? {}))
    if (v !== undefined && v !== '') params.set(k, String(v))
  const url = `/api${path}${params.size ? `?${params}` : ''}`
  let res: Response
  try {
    res = await fetch(url, {
      method: opts.method ?? 'GET',
      credentials: 'same-origin',
      // A FormData body (a file upload) sets its own multipart content type.
      headers:
        opts.body === undefined || opts.body instanceof FormData
          ? {}
          : { 'content-type': 'application/json' },
      body:
        opts.body === undefined || opts.body instanceof FormData
          ? opts.body
          : JSON.stringify(opts.body),
    })
  } catch {
    throw new ApiError(
      0,
      'offline',
      'Chopline cannot be reached. Check your connection and try again.',
    )
  }
  if (!res.ok) {
    const body = (await res.json().catch(() => null)) as ApiErrorBody | null
    if (typeof body?.error?.message === 'string') {
      const { code, message, fields } = body.error
      throw new ApiError(res.status, code, message, fields)
    }
    throw new ApiError(res.status, 'http_error', `The server answered ${res.status}.`)
  }
  if (!opts.method || opts.method === 'GET') noteAnswer(path, res)
  return res
}

/** A multipart body: a file in the field `file`, with text fields beside it. */
export function upload(file: File, fields: Record<string, string | number> = {}): FormData {
  const form = new FormData()
  for (const [k, v] of Object.entries(fields)) form.append(k, String(v))
  form.append('file', file)
  return form
}
