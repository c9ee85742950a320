import { QueryClient } from '@tanstack/vue-query'
import { isApiError } from './http'

/** One cache for server data; a 4xx answer won't change on retry, so only network and 5xx errors are retried. */
export function createQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        retry: (failureCount, error) => failureCount < 2 && !(isApiError(error) && error.status >= 400 && error.status < 500),
      },
    },
  })
}
