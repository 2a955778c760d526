import { QueryClient } from '@tanstack/react-query';
import { ApiError } from './api-error';

export function createQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: {
      queries: {
        staleTime: 5_000,
        // Client errors (4xx) and shape errors will not get better by asking again.
        retry: (failureCount, error) => {
          if (error instanceof ApiError && error.status >= 400 && error.status < 500) return false;
          if (error instanceof ApiError && error.code === 'bad_response') return false;
          return failureCount < 2;
        },
      },
      mutations: { retry: false },
    },
  });
}
