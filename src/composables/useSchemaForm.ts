import { reactive, ref, type UnwrapRef } from 'vue'
import { checkForm, formMessage, serverFieldErrors, type FieldErrors } from './formErrors'

interface Schema<T> {
  safeParse: Parameters<typeof checkForm<T>>[0]['safeParse']
}

/**
 * A form checked against its shared zod schema before it is sent: values, a message per field, one sentence
 * for the whole form (the server's own when it refuses), and a submit that sends the parsed input once at a time.
 */
export function useSchemaForm<V extends object, T>(schema: Schema<T>, initial: V, send: (input: T) => Promise<unknown>) {
  const values = reactive({ ...initial })
  const fieldErrors = ref<FieldErrors>({})
  const formError = ref<string | null>(null)
  const submitting = ref(false)

  async function submit(): Promise<boolean> {
    if (submitting.value) return false
    formError.value = null
    const { input, errors } = checkForm(schema, values)
    fieldErrors.value = errors
    if (input === null) return false
    submitting.value = true
    try {
      await send(input)
      return true
    } catch (error) {
      formError.value = formMessage(error)
      fieldErrors.value = serverFieldErrors(error)
      return false
    } finally {
      submitting.value = false
    }
  }

  function reset(next: Partial<V> = {}): void {
    Object.assign(values, initial, next)
    fieldErrors.value = {}
    formError.value = null
  }

  return { values: values as UnwrapRef<V>, fieldErrors, formError, submitting, submit, reset }
}
