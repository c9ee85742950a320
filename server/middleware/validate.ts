import type { RequestHandler } from 'express'
import { z, type ZodType } from 'zod'
import { HttpError } from '../errors'

interface Schemas {
  body?: ZodType
  query?: ZodType
  params?: ZodType
}

/** Parses body, query and params with zod; the parsed values replace the raw ones (typed via `res.locals`). */
export function validate(schemas: Schemas): RequestHandler {
  return (req, res, next) => {
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part]
      if (!schema) continue
      const result = schema.safeParse(req[part] ?? {})
      if (!result.success) {
        const details = result.error.issues.map((i) => ({ path: [part, ...i.path].join('.'), message: i.message }))
        const first = details[0]
        return next(new HttpError(400, 'invalid-input', `${first?.path}: ${first?.message}`, details))
      }
      res.locals[part] = result.data
    }
    next()
  }
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
