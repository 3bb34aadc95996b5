import { CHECK_VIOLATION, FOREIGN_KEY_VIOLATION, pgErrorOf } from '@hitchbook/db';
import { AppError } from '../../common/errors/app-error.js';

// The database's own rules are the last line: when a request slips past the checks in code (a row
// archived or deleted between the check and the write), the violated constraint names the field.
const CONSTRAINT_PATHS: Record<string, { path: string; message: string }> = {
  work_entries_field_fk: { path: 'fieldId', message: 'No such field or road stretch in this operation.' },
  work_entries_power_fk: { path: 'powerMachineId', message: 'No such machine in this operation.' },
  work_entries_implement_fk: { path: 'implementMachineId', message: 'No such machine in this operation.' },
  work_entries_work_type_fk: { path: 'workTypeId', message: 'No such work type in this operation.' },
  work_entries_bill_to_fk: { path: 'billToPartyId', message: 'No such household or customer in this operation.' },
  work_entries_operator_user_id_users_id_fk: { path: 'operatorUserId', message: 'No such member.' },
  work_entries_hours_check: { path: 'hours', message: 'Hours must be between 0 and 24.' },
  work_entries_meter_order_check: { path: 'meterEnd', message: 'The meter end is below the meter start.' },
  work_entries_clock_order_check: { path: 'endedAt', message: 'The end time is before the start time.' },
  work_entries_quantities_check: { path: 'acres', message: 'Quantities cannot be negative.' },
  cost_entries_machine_fk: { path: 'machine', message: 'No such machine in this operation.' },
  cost_entries_paid_by_fk: { path: 'paid by', message: 'No such household in this operation.' },
  cost_entries_amount_check: { path: 'amount', message: 'The amount cannot be negative.' },
};

/** The 400 for a violated foreign key or check constraint, or null for any other error. */
export function constraintError(err: unknown): AppError | null {
  const pg = pgErrorOf(err);
  if (!pg || (pg.code !== FOREIGN_KEY_VIOLATION && pg.code !== CHECK_VIOLATION)) return null;
  const known = pg.constraint ? CONSTRAINT_PATHS[pg.constraint] : undefined;
  if (!known) return null;
  return new AppError('validation', 'Some fields need attention.', [known]);
}
