import { reactive, ref, watch } from 'vue'
import { signInSchema } from '@shared/schemas/auth'
import type { SignInInput } from '@shared/schemas/auth'
import { isApiError } from '@/api/http'
import { useSessionStore } from '@/stores/session'

type Field = keyof SignInInput
export type SignInFieldErrors = Partial<Record<Field, string>>

const BAD_CREDENTIALS_MESSAGE = 'E-mail or password is wrong'

export interface UseSignInFormOptions {
  onSignedIn: () => void | Promise<void>
}

/** The sign-in form's state: values, per-field messages, one form-level message, and the submit action. */
export function useSignInForm({ onSignedIn }: UseSignInFormOptions) {
  const session = useSessionStore()
  const values = reactive<SignInInput>({ email: '', password: '' })
  const fieldErrors = ref<SignInFieldErrors>({})
  const formError = ref<string | null>(null)
  const submitting = ref(false)
  /** After the first attempt, messages follow the input as it is corrected. */
  const attempted = ref(false)

  function validate(): SignInInput | null {
    const candidate = { email: values.email.trim(), password: values.password }
    const errors: SignInFieldErrors = {}
    if (!candidate.email) errors.email = 'Enter your e-mail address'
    if (!candidate.password) errors.password = 'Enter your password'
    const result = signInSchema.safeParse(candidate)
    if (!result.success) {
      for (const issue of result.error.issues) {
        const field = issue.path[0]
        if ((field === 'email' || field === 'password') && !errors[field]) errors[field] = issue.message
      }
    }
    fieldErrors.value = errors
    return result.success ? result.data : null
  }

  watch(values, () => {
    if (attempted.value) validate()
  })

  async function submit(): Promise<boolean> {
    if (submitting.value) return false
    attempted.value = true
    formError.value = null
    const input = validate()
    if (!input) return false

    submitting.value = true
    try {
      await session.signIn(input)
    } catch (error) {
      formError.value = messageFor(error)
      fieldErrors.value = { ...fieldErrors.value, ...serverFieldErrors(error) }
      return false
    } finally {
      submitting.value = false
    }
    await onSignedIn()
    return true
  }

  return { values, fieldErrors, formError, submitting, submit }
}

function messageFor(error: unknown): string {
  if (!isApiError(error)) return 'Something went wrong. Try again.'
  if (error.code === 'bad-credentials' || error.status === 401) return BAD_CREDENTIALS_MESSAGE
  if (error.status === 429) return 'Too many attempts. Wait a few minutes, then try again.'
  if (error.code === 'invalid-input') return 'Check the highlighted fields.'
  return error.message
}

/** The server's `details: [{ path, message }]` for invalid input, as messages under the fields. */
function serverFieldErrors(error: unknown): SignInFieldErrors {
  if (!isApiError(error) || error.code !== 'invalid-input' || !Array.isArray(error.details)) return {}
  const errors: SignInFieldErrors = {}
  for (const detail of error.details as unknown[]) {
    if (typeof detail !== 'object' || detail === null) continue
    const { path, message } = detail as { path?: unknown; message?: unknown }
    const field: unknown = Array.isArray(path) ? (path as unknown[])[0] : path
    if ((field === 'email' || field === 'password') && typeof message === 'string') errors[field] = message
  }
  return errors
}
