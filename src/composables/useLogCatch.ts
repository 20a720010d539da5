import { useMessage } from 'naive-ui'
import type { CatchInput } from '@shared/schemas/journal'
import { logCatch } from '@/offline/catch-queue'
import { useAuthStore } from '@/stores/auth'

/**
 * The catch form's submit for the signed-in angler: logs the catch, or keeps it on the phone with
 * no network (`logCatch`), and says which in a toast.
 */
export function useLogCatch() {
  const message = useMessage()
  const auth = useAuthStore()
  return async (input: CatchInput & { clientId: string }, photo: File | null) => {
    const done = await logCatch(auth.user!.id, input, photo)
    message.success(
      done === 'kept' ? "Saved on this phone; will send when you're back online." : 'Catch logged.',
    )
  }
}
