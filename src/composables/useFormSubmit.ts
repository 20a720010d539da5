import type { FormInst } from 'naive-ui'
import { ref, type Ref } from 'vue'
import { useFieldErrors } from '@/composables/useFieldErrors'
import { online } from '@/offline/network'

/**
 * Submitting a naive-ui form: its own rules first, then the call. Server field errors land on their
 * fields (`server`); an error that names no field becomes `problem`.
 */
export function useFormSubmit(form: Ref<FormInst | null>) {
  const server = useFieldErrors()
  const problem = ref<string | null>(null)
  const busy = ref(false)

  async function submit(run: () => Promise<void>) {
    problem.value = null
    server.clear()
    if (!online.value) {
      problem.value =
        'You are offline: this needs a connection. Try again when the network is back.'
      return
    }
    try {
      await form.value?.validate()
    } catch {
      return
    }
    busy.value = true
    try {
      await run()
    } catch (err) {
      problem.value = server.take(err)
    } finally {
      busy.value = false
    }
  }

  return { server, problem, busy, submit }
}
