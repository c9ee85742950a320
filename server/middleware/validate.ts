import { z, type ZodType } from 'zod'
import { HttpError } from '../errors'

export type InputPart = 'params' | 'query' | 'body'

/** Parses one part of a request with zod; a mismatch is a 400 naming the first field (`body.title: …`), every issue in `details`. */
export function parsePart<S extends ZodType>(part: InputPart, schema: S, value: unknown): z.output<S> {
  const result = schema.safeParse(value ?? {})
  if (result.success) return result.data
  const details = result.error.issues.map((i) => ({ path: [part, ...i.path].join('.'), message: i.message }))
  const first = details[0]
  throw new HttpError(400, 'invalid-input', `${first?.path}: ${first?.message}`, details)
}

// ids are PostgreSQL integers written in plain digits: anything larger would fail in the database instead of here
const id = z
  .string()
  .regex(/^[1-9][0-9]*$/, { message: 'must be a positive whole number' })
  .transform(Number)
  .pipe(z.number().max(2_147_483_647, { message: 'is too large to be an id' }))

/** A params schema of numeric ids, e.g. `idParams('channelId', 'puzzleId')`. */
export function idParams<K extends string>(...names: K[]) {
  return z.object(Object.fromEntries(names.map((name) => [name, id])) as Record<K, typeof id>)
}
