import { useMutation } from '@tanstack/vue-query'
import { useMessage } from 'naive-ui'
import { nextTick, ref, type Ref } from 'vue'
import type { Position } from '@shared/geo/types'
import type { BankInput, BankView } from '@shared/schemas/banks'
import { banksApi } from '@/api/banks'

/**
 * Adding and editing banks on a lake's outline: adding picks points first (`picked`, null when
 * not picking), editing keeps the bank's points. Focus follows the work, so it is never left on a
 * button that has just gone away: the outline when adding starts, "Add a bank" (`.add-bank`) on
 * cancel, the saved bank's row (`data-bank-id`) after a save; all found inside `root`.
 */
export function useBankEditor(slug: Ref<string>, refresh: () => Promise<void>) {
  const message = useMessage()
  const picked = ref<Position[] | null>(null)
  const editing = ref<BankView | null>(null)
  const tapHint = ref(false)
  const root = ref<HTMLElement | null>(null)
  const outline = ref<{ focus: () => void } | null>(null)
  const focusOn = async (selector: string) => {
    await nextTick()
    root.value?.querySelector<HTMLElement>(selector)?.focus()
  }
  async function startAdding() {
    editing.value = null
    picked.value = []
    await nextTick()
    outline.value?.focus()
  }
  function edit(bank: BankView) {
    picked.value = null
    editing.value = bank
    void focusOn('#bank-name')
  }
  function stop() {
    picked.value = null
    editing.value = null
    void focusOn('.add-bank')
  }
  function pick(point: Position) {
    tapHint.value = false
    picked.value?.push(point)
  }
  const save = useMutation({
    mutationFn: (bank: BankInput) =>
      editing.value
        ? banksApi.update(slug.value, editing.value.id, bank)
        : banksApi.create(slug.value, bank),
    onSuccess: async (saved) => {
      message.success(`Saved ${saved.name}.`)
      picked.value = null
      editing.value = null
      await refresh()
      await focusOn(`[data-bank-id="${saved.id}"]`)
    },
  })
  /** BankForm's submit: the form's fields with the picked (or kept) points. */
  const submit = async (desc: Omit<BankInput, 'points'>) => {
    await save.mutateAsync({ ...desc, points: editing.value?.points ?? picked.value ?? [] })
  }
  return { picked, editing, tapHint, root, outline, startAdding, edit, stop, pick, submit }
}
