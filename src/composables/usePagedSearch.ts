import { keepPreviousData, useQuery } from '@tanstack/vue-query'
import { computed, ref, watch } from 'vue'
import { useDebouncedRef } from './useDebouncedRef'

interface PageRequest {
  q: string
  page: number
  pageSize: number
}

/**
 * A searchable list paged on the server: the search box text (debounced), the page (back to 1 when
 * the search changes), the query for the current page and the page count.
 */
export function usePagedSearch<T extends { total: number }>(
  key: string,
  fetchPage: (req: PageRequest) => Promise<T>,
  pageSize = 20,
) {
  const search = ref('')
  const q = useDebouncedRef(search, 250)
  const page = ref(1)
  watch(q, () => (page.value = 1))
  const query = useQuery({
    queryKey: [key, q, page],
    queryFn: () => fetchPage({ q: q.value, page: page.value, pageSize }),
    placeholderData: keepPreviousData,
  })
  const pageCount = computed(() =>
    Math.max(1, Math.ceil((query.data.value?.total ?? 0) / pageSize)),
  )
  return { search, page, pageSize, pageCount, ...query }
}
