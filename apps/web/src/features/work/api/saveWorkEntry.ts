import type { QueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { workEntryCreateSchema, WorkEntryWithWarnings } from '@hitchbook/shared/schemas/work-entries';
import { api } from '../../../lib/api';

/** A new entry as the cab form sends it: decimals as typed strings, and the id made on the device. */
export type NewWorkEntry = z.input<typeof workEntryCreateSchema> & { clientId: string };

/**
 * The one way a new entry reaches the server. The clientId makes a resend safe: the server
 * answers a repeated clientId with the entry it already stored instead of making a second one.
 */
export function saveWorkEntry(input: NewWorkEntry): Promise<WorkEntryWithWarnings> {
  return api.post<WorkEntryWithWarnings>('/api/work-entries', input);
}

/** A logged entry moves a machine's meter and the tables that show it. */
export async function refreshAfterEntryChange(queryClient: QueryClient): Promise<void> {
  await Promise.all([queryClient.invalidateQueries({ queryKey: ['work-entries'] }), queryClient.invalidateQueries({ queryKey: ['machines'] })]);
}
