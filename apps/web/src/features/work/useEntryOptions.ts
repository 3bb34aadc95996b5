import type { Role } from '@hitchbook/shared/roles';
import type { EntryOptions } from './components/EntryFields';
import { useBillToParties, useFieldOptions, useMachineOptions, useOperators, useWorkTypes } from './api/entryOptionQueries';

/**
 * Everything the entry form picks from, loaded together. Only an owner picks the operator: a
 * partner or an operator logs their own work, and the server fills them in.
 */
export function useEntryOptions(role: Role) {
  const machines = useMachineOptions();
  const fields = useFieldOptions();
  const workTypes = useWorkTypes();
  const parties = useBillToParties();
  const picksOperator = role === 'owner';
  const operators = useOperators(role);
  const queries = [machines, fields, workTypes, parties, ...(picksOperator ? [operators] : [])];
  const error = queries.find((q) => q.isError)?.error ?? null;
  const retry = () => queries.forEach((q) => void q.refetch());
  if (!machines.data || !fields.data || !workTypes.data || !parties.data || (picksOperator && !operators.data)) {
    return { options: null, error, retry };
  }
  const options: EntryOptions = {
    machines: machines.data,
    fields: fields.data,
    workTypes: workTypes.data,
    parties: parties.data,
    operators: picksOperator ? (operators.data ?? null) : null,
  };
  return { options, error, retry };
}
