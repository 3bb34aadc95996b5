import type { QueryClient } from '@tanstack/react-query';

/**
 * After any change to an invoice: its lists and pages, the dashboard's money cards, and the work
 * entries it holds or frees (their state shows "on invoice").
 */
export async function invalidateBilling(queryClient: QueryClient): Promise<void> {
  await Promise.all([
    queryClient.invalidateQueries({ queryKey: ['invoices'] }),
    queryClient.invalidateQueries({ queryKey: ['dashboard'] }),
    queryClient.invalidateQueries({ queryKey: ['work-entries'] }),
  ]);
}
