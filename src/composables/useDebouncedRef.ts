import { ref, watch, type Ref } from 'vue'

/** A copy of `source` that follows it once it has been still for `ms`. */
export function useDebouncedRef<T>(source: Ref<T>, ms: number): Ref<T> {
  const debounced = ref(source.value) as Ref<T>
  let timer: ReturnType<typeof setTimeout> | undefined
  watch(source, (value) => {
    clearTimeout(timer)
    timer = setTimeout(() => (debounced.value = value), ms)
  })
  return debounced
}
