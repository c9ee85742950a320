/**
 * The whole outline as JSON, for backups and the API; reading it back validates everything.
 */
import { outlineSchema, type Outline } from '../schemas/outline'

export function toOutlineJson(outline: Outline): string {
  return JSON.stringify(outline, null, 2)
}

/** Parses and validates an outline from JSON text (or an already parsed value). */
export function fromOutlineJson(input: unknown): Outline {
  let value = input
  if (typeof input === 'string') {
    try {
      value = JSON.parse(input)
    } catch (e) {
      throw new Error(`outline JSON can't be read: ${(e as Error).message}`, { cause: e })
    }
  }
  const parsed = outlineSchema.safeParse(value)
  if (!parsed.success) {
    const issues = parsed.error.issues.slice(0, 3).map((i) => `${i.path.length ? `${i.path.join('.')}: ` : ''}${i.message}`)
    throw new Error(`outline JSON is invalid: ${issues.join('; ')}`)
  }
  return parsed.data
}
