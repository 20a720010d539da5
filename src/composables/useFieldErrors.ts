import { reactive } from 'vue'
import { ApiError } from '@/api/http'

/**
 * Server-side field messages for a naive-ui form: `v-bind="errors.bind(field)"` on an n-form-item
 * sets its validation status and feedback. `take` returns the message for errors that name no field.
 */
export function useFieldErrors() {
  const fields = reactive<Record<string, string>>({})

  function clear() {
    for (const key of Object.keys(fields)) delete fields[key]
  }

  function take(err: unknown): string | null {
    clear()
    if (!(err instanceof ApiError)) return 'Something went wrong. Try again.'
    Object.assign(fields, err.fields)
    return Object.keys(err.fields).length ? null : err.message
  }

  return {
    fields,
    clear,
    take,
    bind: (field: string) => ({
      'validation-status': fields[field] ? ('error' as const) : undefined,
      feedback: fields[field],
    }),
  }
}
