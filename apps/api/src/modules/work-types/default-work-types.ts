import { workTypes, type Executor } from '@hitchbook/db';
import { defaultWorkTypeRows } from '@hitchbook/shared/work-types';

/** Gives an operation the default work types; ones it already has (by key) are left as they are. */
export async function seedDefaultWorkTypes(executor: Executor, operationId: string): Promise<void> {
  await executor
    .insert(workTypes)
    .values(defaultWorkTypeRows(operationId))
    .onConflictDoNothing({ target: [workTypes.operationId, workTypes.key] });
}
