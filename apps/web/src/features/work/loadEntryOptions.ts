import type { Role } from '@hitchbook/shared/roles';
import type { SessionUser } from '@hitchbook/shared/schemas/auth';
import { useLoaded } from '../../lib/useLoaded';
import { listBillToParties } from './api/listBillToParties';
import { listFieldOptions } from './api/listFieldOptions';
import { listMachineOptions } from './api/listMachineOptions';
import { activeOperators, listMembers } from './api/listMembers';
import { listWorkTypes } from './api/listWorkTypes';
import type { EntryOptions } from './components/EntryFields';

/**
 * Everything the entry forms pick from, read together without the query cache, so the cab page can read it
 * too. Only an owner picks the operator: a partner or an operator logs their own work, and the server fills
 * them in.
 */
export async function loadEntryOptions(role: Role, signal: AbortSignal): Promise<EntryOptions> {
  const [machines, fields, workTypes, parties, operators] = await Promise.all([
    listMachineOptions(signal),
    listFieldOptions(signal),
    listWorkTypes(signal),
    listBillToParties(signal),
    role === 'owner' ? listMembers(signal).then(activeOperators) : null,
  ]);
  return { machines, fields, workTypes, parties, operators };
}

/** The entry forms' pickers for the signed-in person, read again only when the operation or role changes. */
export function useEntryOptions(user: Pick<SessionUser, 'operationId' | 'role'>) {
  return useLoaded(`${user.operationId}:${user.role}`, (signal) => loadEntryOptions(user.role, signal));
}
