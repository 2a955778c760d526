import { QueryClientProvider } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { RouterProvider } from 'react-router-dom';
import { createQueryClient } from '../lib/query-client';
import { session, useSession } from '../lib/session';
import { createRouter } from './router';

/** Ends the session when its token expires, and forgets cached data when anyone signs out. */
function useSessionLifecycle(clearCache: () => void) {
  const current = useSession();
  useEffect(() => {
    if (!current) {
      clearCache();
      return;
    }
    if (current.expiresAt === null) return;
    // setTimeout holds at most about 24.8 days; tokens here live 12 h.
    const delay = Math.min(Math.max(0, current.expiresAt - Date.now()), 2 ** 31 - 1);
    const id = window.setTimeout(() => session.clear('expired'), delay);
    return () => window.clearTimeout(id);
  }, [current, clearCache]);
}

export function AppProvider() {
  const [queryClient] = useState(createQueryClient);
  const [router] = useState(createRouter);
  const [clearCache] = useState(() => () => queryClient.clear());
  useSessionLifecycle(clearCache);
  return (
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>
  );
}
