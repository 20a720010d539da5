import { QueryClient } from '@tanstack/vue-query'

/** The app's one query cache: the plugin serves it to components, the router prefetches into it. */
export const queryClient = new QueryClient()
