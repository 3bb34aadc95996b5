import type { Role } from '@hitchbook/shared/roles';
import { listBillToParties } from './api/listBillToParties';
import { listFieldOptions } from './api/listFieldOptions';
import { listMachineOptions } from './api/listMachineOptions';
import { activeOperators, listMembers } from './api/listMembers';
import { listWorkTypes } from './api/listWorkTypes';
import type { EntryOptions } from './components/EntryFields';

/**
 * Everything the cab form picks from, read together without the query cache (useEntryOptions is the
 * office pages' version of the same reads). Only an owner picks the operator: a partner or an operator
 * logs their own work, and the server fills them in.
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
