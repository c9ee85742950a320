import type { StaleBody } from '../shared/schemas/studio'

/** An error meant for the API caller: its status, a stable code and a message a person understands. */
export class HttpError extends Error {
  readonly isOperational = true
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
    /** more fields for the top level of the reply, beside code and message (the health check's report) */
    readonly fields?: Record<string, unknown>,
  ) {
    super(message)
    this.name = 'HttpError'
  }
}

export const notFound = (what: string) => new HttpError(404, 'not-found', `${what} not found`)
export const forbidden = (message = 'Your role in this channel does not allow this') =>
  new HttpError(403, 'forbidden', message)

/** A save based on an old version: nothing was written, and the caller gets the current copy to compare with. */
export const stale = <T>(what: string, current: T) =>
  new HttpError(
    409,
    'stale',
    `Someone saved a newer version of this ${what} while you were editing. Nothing of yours was overwritten: compare with the current copy and save again.`,
    { current } satisfies StaleBody<T>['details'],
  )

const READ_METHODS = new Set(['GET', 'HEAD', 'OPTIONS'])

/** The database did not answer: nothing was read or stored, and the same request may work in a moment. */
export const databaseUnavailable = (request: { method: string; path: string }) =>
  new HttpError(503, 'database-unavailable', unavailableMessage(request))

// The two saves a browser keeps and sends again by itself: the studio's autosave and the puzzle screen's save.
const KEPT_SAVES = [/^PATCH \/api\/channels\/\d+\/outlines\/\d+$/, /^PUT \/api\/channels\/\d+\/puzzles\/\d+$/]

// Said to a person: a read, a sign-in, a kept save and any other change each lose something different.
function unavailableMessage({ method, path }: { method: string; path: string }): string {
  if (READ_METHODS.has(method)) return 'The database is unavailable, so this could not be loaded. Try again in a moment.'
  const route = `${method} ${path.split('?')[0]}`
  if (route === 'POST /api/auth/sign-in') return "The database is unavailable, so signing in can't be checked right now. Try again in a moment."
  if (KEPT_SAVES.some((pattern) => pattern.test(route))) {
    return "The database is unavailable; this change was not saved — it is kept in this browser and will be sent when it's back."
  }
  return "The database is unavailable, so this wasn't done. Try again in a moment."
}

/** An unexpected failure: nothing is known about what was stored, so a change is not claimed safe. */
export const internalError = (method: string) =>
  new HttpError(
    500,
    'internal',
    READ_METHODS.has(method)
      ? 'Something went wrong on our side. Please try again.'
      : 'Something went wrong on our side, and this change may not have been saved. Please try again.',
  )
