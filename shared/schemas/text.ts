/**
 * The one building block for text a person types: every text field of the wire contract goes through
 * `text()` (or `webAddress()`), so each has a length limit and none can carry characters that break
 * storage. PostgreSQL refuses a NUL (0x00) in text and JSON, and a lone UTF-16 surrogate has no UTF-8
 * form (it would be stored as U+FFFD, or refused inside JSON): both are a 400 here, never a 500 there.
 */
import { z } from 'zod'

interface TextOptions {
  /** names the field in messages, e.g. 'title' → "title can be at most 200 characters" */
  label: string
  /** longest length in UTF-16 code units (what `String.length` counts; never fewer than characters) */
  max: number
  /** refuse empty text; a string is the message to show instead of "<label> must not be empty" */
  required?: boolean | string
  /** drop white space at both ends before any check (the stored value is the trimmed one) */
  trim?: boolean
}

/** A text field with a length limit, refusing NUL characters and lone surrogates with messages naming it. */
export function text({ label, max, required = false, trim = false }: TextOptions): z.ZodString {
  let schema = trim ? z.string().trim() : z.string()
  // abort: a megabyte of text is refused on its length alone, without scanning it again
  schema = schema.max(max, { message: `${label} can be at most ${max} characters`, abort: true })
  if (required) schema = schema.min(1, typeof required === 'string' ? required : `${label} must not be empty`)
  return schema.check(...brokenCharacterChecks(label))
}

/** An http(s) address (a javascript: or data: one would run when a page puts it in an href), or '' for none. */
export function webAddress(label: string) {
  const address = z
    .url({ protocol: /^https?$/, message: `${label} must be a web address (https://…)` })
    .max(WEB_ADDRESS_MAX, { message: `${label} can be at most ${WEB_ADDRESS_MAX} characters`, abort: true })
  // the URL check lets both through inside a path, so they are refused here as in any other text
  return z.union([address.check(...brokenCharacterChecks(label)), z.literal('')])
}

// long enough for any real link with its tracking parameters; what browsers and servers commonly cap near
const WEB_ADDRESS_MAX = 2000

// with the u flag a paired surrogate is one astral code point, so only a lone half is in the Cs category
const LONE_SURROGATE = /\p{Cs}/u

const brokenCharacterChecks = (label: string) => [
  z.refine<string>((s) => !s.includes('\u0000'), `${label} can't contain a NUL character`),
  z.refine<string>((s) => !LONE_SURROGATE.test(s), `${label} can't contain half of a UTF-16 surrogate pair (a broken character)`),
]
