import { QueryClientProvider } from '@tanstack/react-query';
import { useState } from 'react';
import { RouterProvider } from 'react-router';
import { createQueryClient } from '../lib/query-client';
import { sessionKeys } from '../features/session/api/keys';
import { createAppRouter } from './router';

function createClientAndRouter() {
  const holder: { router?: ReturnType<typeof createAppRouter> } = {};
  const queryClient = createQueryClient({
    // A session that ends while a page is open sends the person to sign in, then back here.
    onUnauthorized: () => {
      const router = holder.router;
      // While a navigation is loading, its loaders answer a 401 themselves (redirect to sign-in).
      if (!router || router.state.navigation.state !== 'idle') return;
      const { pathname, search } = router.state.location;
      if (!pathname.startsWith('/app')) return;
      queryClient.removeQueries({ queryKey: sessionKeys.all });
      void router.navigate(`/sign-in?next=${encodeURIComponent(pathname + search)}`, { replace: true });
    },
  });
  holder.router = createAppRouter(queryClient);
  return { queryClient, router: holder.router };
}

export function AppProvider() {
  const [{ queryClient, router }] = useState(createClientAndRouter);
  return (
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>
  );
}
