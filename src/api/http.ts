import { apiErrorSchema } from '@shared/schemas/auth'
import { config } from '@/config'

/** A failed API call, whatever went wrong: status 0 means the server was never reached. */
export class ApiError extends Error {
  override readonly name = 'ApiError'

  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message)
  }
}

export function isApiError(value: unknown): value is ApiError {
  return value instanceof ApiError
}

/** The code of the server's 503 while its database is away: nothing was read or stored, and a retry may work. */
export const DATABASE_UNAVAILABLE = 'database-unavailable'

/**
 * How long to wait before sending a request again after `failedBefore` failures that pass by themselves (the
 * database away, no connection): doubling from `firstMs` up to `maxMs`, and somewhere between half and all of
 * that, so the browsers that were waiting don't all come back in the same second.
 */
export function retryDelayMs(failedBefore: number, { firstMs = 2000, maxMs = 60_000 }: { firstMs?: number; maxMs?: number } = {}): number {
  const ceiling = Math.min(maxMs, firstMs * 2 ** failedBefore)
  return Math.round(ceiling / 2 + (Math.random() * ceiling) / 2)
}

/** Anything with a zod-like `parse`; every response body is checked against the shared contract. */
export interface Parser<T> {
  parse(data: unknown): T
}

export interface HttpAuth {
  /** The bearer token to send, or null when nobody is signed in. */
  getToken(): string | null
  /** Called when a request that carried a token answers 401: the session is no longer valid. */
  onUnauthorized(): void
}

export interface RequestOptions {
  /** Send the bearer token (default true). Sign-in turns it off. */
  auth?: boolean
  signal?: AbortSignal
  /** a tag from an earlier answer: an unchanged resource answers 304 (see `http.getIfChanged`) */
  ifNoneMatch?: string
}

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE'

let auth: HttpAuth = { getToken: () => null, onUnauthorized: () => {} }

/** The session store registers itself here, so the client never imports a store (no import cycle). */
export function setHttpAuth(next: HttpAuth): void {
  auth = next
}

/** The registered session, for the one request `fetch` can't make: an upload that reports its progress (src/api/recordings.ts). */
export function httpAuth(): HttpAuth {
  return auth
}

/** Sends a request with the session's token; any non-2xx answer becomes an ApiError. */
async function send(method: Method, path: string, body: unknown, options: RequestOptions = {}): Promise<Response> {
  const headers: Record<string, string> = { Accept: 'application/json' }
  if (body !== undefined) headers['Content-Type'] = 'application/json'
  const token = options.auth === false ? null : auth.getToken()
  if (token) headers.Authorization = `Bearer ${token}`
  if (options.ifNoneMatch) headers['If-None-Match'] = options.ifNoneMatch

  let response: Response
  try {
    response = await fetch(`${config.apiBase}${path}`, {
      method,
      headers,
      body: body === undefined ? undefined : JSON.stringify(body),
      signal: options.signal,
      // asking with a tag of our own: the browser's cache must not answer in our place
      ...(options.ifNoneMatch === undefined ? {} : { cache: 'no-store' as const }),
    })
  } catch (error) {
    // An abort is the caller's decision (e.g. a query that is no longer needed), not a failure to report.
    if (error instanceof DOMException && error.name === 'AbortError') throw error
    throw new ApiError(0, 'network-error', "Can't reach Gridcue. Check your connection and try again.")
  }
  if (!response.ok && !(response.status === 304 && options.ifNoneMatch)) {
    if (response.status === 401 && token) auth.onUnauthorized()
    throw toApiError(response.status, await readJson(response))
  }
  return response
}

async function request<T>(method: Method, path: string, parser: Parser<T>, body: unknown, options: RequestOptions = {}): Promise<T> {
  const response = await send(method, path, body, options)
  const data = await readJson(response)
  try {
    return parser.parse(data)
  } catch {
    throw new ApiError(response.status, 'unexpected-response', 'The server sent an answer Gridcue does not understand.')
  }
}

async function readJson(response: Response): Promise<unknown> {
  if (response.status === 204) return undefined
  const text = await response.text()
  if (!text) return undefined
  try {
    return JSON.parse(text)
  } catch {
    return undefined
  }
}

/** A non-2xx answer as an ApiError: the server's `{ code, message }` when it sent one, else a sentence of our own. */
export function toApiError(status: number, data: unknown): ApiError {
  const body = apiErrorSchema.safeParse(data)
  if (body.success) return new ApiError(status, body.data.code, body.data.message, body.data.details)
  return new ApiError(status, `http-${status}`, fallbackMessage(status))
}

function fallbackMessage(status: number): string {
  if (status === 401) return 'Please sign in again.'
  if (status === 403) return "You don't have access to this."
  if (status === 404) return 'Not found.'
  if (status === 429) return 'Too many requests. Wait a minute and try again.'
  if (status >= 500) return 'Something went wrong on the server. Try again in a moment.'
  return `The request failed (${status}).`
}

/** For calls whose body is ignored (e.g. 204 No Content). */
export const noContent: Parser<void> = { parse: () => undefined }

export const http = {
  get: <T>(path: string, parser: Parser<T>, options?: RequestOptions) => request('GET', path, parser, undefined, options),
  post: <T>(path: string, body: unknown, parser: Parser<T>, options?: RequestOptions) => request('POST', path, parser, body, options),
  put: <T>(path: string, body: unknown, parser: Parser<T>, options?: RequestOptions) => request('PUT', path, parser, body, options),
  patch: <T>(path: string, body: unknown, parser: Parser<T>, options?: RequestOptions) => request('PATCH', path, parser, body, options),
  delete: <T>(path: string, parser: Parser<T>, options?: RequestOptions) => request('DELETE', path, parser, undefined, options),
  /**
   * A resource only when it changed since the answer tagged `etag` (null: not asked before): null on 304,
   * so polling an unchanged one costs a header, not a body to read and check.
   */
  getIfChanged: async <T>(path: string, parser: Parser<T>, etag: string | null, options?: RequestOptions): Promise<{ etag: string | null; data: T } | null> => {
    const response = await send('GET', path, undefined, { ...options, ifNoneMatch: etag ?? '' })
    if (response.status === 304) return null
    try {
      return { etag: response.headers.get('ETag'), data: parser.parse(await readJson(response)) }
    } catch {
      throw new ApiError(response.status, 'unexpected-response', 'The server sent an answer Gridcue does not understand.')
    }
  },
  /** A file the server makes (e.g. a PDF), fetched with the session's token. */
  getBlob: async (path: string, options?: RequestOptions): Promise<Blob> => (await send('GET', path, undefined, options)).blob(),
}
