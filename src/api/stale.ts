import type { StaleBody } from '@shared/schemas/studio'
import type { Parser } from './http'
import { ApiError, isApiError } from './http'

/** A save refused because someone else saved first (409): carries the copy now on the server. */
export class StaleError<T> extends ApiError {
  constructor(
    message: string,
    readonly current: T,
  ) {
    super(409, 'stale', message)
  }
}

export function isStaleError<T = unknown>(value: unknown): value is StaleError<T> {
  return value instanceof StaleError
}

/**
 * Turns a 409 from a versioned save into a StaleError holding the server's copy (`details.current` of its StaleBody); a copy that doesn't parse is fetched again.
 * The copy may be larger than what a save answers (an outline save answers its summary, a 409 the whole record).
 */
export async function withStaleCheck<T, Current = T>(save: () => Promise<T>, parser: Parser<Current>, fetchCurrent: () => Promise<Current>): Promise<T> {
  try {
    return await save()
  } catch (error) {
    if (!isApiError(error) || error.status !== 409) throw error
    const details = error.details as Partial<StaleBody<unknown>['details']> | undefined
    const current = readQuietly(parser, details?.current) ?? (await fetchCurrent())
    throw new StaleError(error.message || 'Someone else saved a newer version.', current)
  }
}

function readQuietly<T>(parser: Parser<T>, data: unknown): T | undefined {
  if (data === undefined || data === null) return undefined
  try {
    return parser.parse(data)
  } catch {
    return undefined
  }
}
