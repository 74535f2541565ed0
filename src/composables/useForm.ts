import type { Ref } from 'vue'
import type { z } from 'zod'
import { reactive, ref } from 'vue'
import { ApiError } from '../api/errors'

/**
 * A form's errors beside each field, worded with the field's label ("Password must be at least 10
 * characters"), from the shared zod schema before sending and from the server's answer after, and
 * its busy state while the request runs.
 */
export function useForm<K extends string>(labels: Record<K, string>): {
  errors: Partial<Record<K, string>>
  formError: Ref<string>
  busy: Ref<boolean>
  check: <S extends z.ZodType>(schema: S, values: unknown) => z.infer<S> | null
  fromError: (error: unknown) => void
  submit: <S extends z.ZodType>(schema: S, values: unknown, action: (body: z.infer<S>) => Promise<void>) => Promise<void>
} {
  const errors = reactive({}) as Partial<Record<K, string>>
  const formError = ref('')
  const busy = ref(false)

  function clear(): void {
    for (const key of Object.keys(labels) as K[])
      delete errors[key]
    formError.value = ''
  }

  function place(path: string, message: string): void {
    const field = path.split('.')[0] as K
    if (field in labels)
      errors[field] = `${labels[field]} ${message}`
    else
      formError.value = message
  }

  function check<S extends z.ZodType>(schema: S, values: unknown): z.infer<S> | null {
    clear()
    const result = schema.safeParse(values)
    if (result.success)
      return result.data
    for (const issue of result.error.issues)
      place(issue.path.join('.'), issue.message)
    return null
  }

  function fromError(error: unknown): void {
    clear()
    if (error instanceof ApiError && error.issues.length > 0)
      error.issues.forEach(issue => place(issue.path, issue.message))
    else
      formError.value = error instanceof Error ? error.message : 'Something went wrong.'
  }

  /** Checks the values, then runs the action once with the parsed body; any failure lands on the form. */
  async function submit<S extends z.ZodType>(schema: S, values: unknown, action: (body: z.infer<S>) => Promise<void>): Promise<void> {
    const body = check(schema, values)
    if (!body || busy.value)
      return
    busy.value = true
    try {
      await action(body)
    }
    catch (error) {
      fromError(error)
    }
    finally {
      busy.value = false
    }
  }

  return { errors, formError, busy, check, fromError, submit }
}
