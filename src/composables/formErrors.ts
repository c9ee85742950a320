import { isApiError } from '@/api/http'

interface Checkable<T> {
  safeParse(data: unknown): { success: true; data: T } | { success: false; error: { issues: readonly { path: readonly PropertyKey[]; message: string }[] } }
}

export type FieldErrors = Record<string, string>

/** Checks a form's values against its shared schema: the parsed input, or the first message per field. */
export function checkForm<T>(schema: Checkable<T>, values: unknown): { input: T; errors: FieldErrors } | { input: null; errors: FieldErrors } {
  const result = schema.safeParse(values)
  if (result.success) return { input: result.data, errors: {} }
  const errors: FieldErrors = {}
  for (const issue of result.error.issues) {
    const field = String(issue.path[0] ?? '')
    errors[field] ??= issue.message
  }
  return { input: null, errors }
}

/** The server's `details: [{ path, message }]` on invalid input (e.g. a password too easy to guess), as messages under fields. */
export function serverFieldErrors(error: unknown): FieldErrors {
  if (!isApiError(error) || error.code !== 'invalid-input' || !Array.isArray(error.details)) return {}
  const errors: FieldErrors = {}
  for (const detail of error.details as unknown[]) {
    if (typeof detail !== 'object' || detail === null) continue
    const { path, message } = detail as { path?: unknown; message?: unknown }
    // the server names a field by where it was sent: `body.password`
    const field = typeof path === 'string' ? path.replace(/^body\./, '') : null
    if (field && typeof message === 'string') errors[field] ??= message
  }
  return errors
}

/** One sentence for a failed form: the server's own, or a plain fallback. */
export function formMessage(error: unknown): string {
  if (!isApiError(error)) return 'Something went wrong. Try again.'
  if (error.code === 'invalid-input') return 'Check the highlighted fields.'
  return error.message
}
