import { QueryClientProvider } from '@tanstack/react-query';
import { Outlet } from 'react-router-dom';
import { queryClient } from '../../lib/queryClient';

/** The query cache for the public pages that send a request through it; the sign-in page does without. */
export default function QueryLayout() {
  return (
    <QueryClientProvider client={queryClient}>
      <Outlet />
    </QueryClientProvider>
  );
}
