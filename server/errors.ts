import type { StaleBody } from '../shared/schemas/studio'

/** An error meant for the API caller: its status, a stable code and a message a person understands. */
export class HttpError extends Error {
  readonly isOperational = true
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
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
