import { z } from 'zod';
import { CAUTION_KEYS, type CautionKey } from '../cautions.js';
import { MACHINE_CLASS_IDS, type MachineClassId } from '../machine-classes.js';
import { WORK_UNITS, type WorkUnit } from '../work-types.js';
import { singleLineText } from './common.js';
import { searchQuery } from './machines.js';

function oneOf<const T extends readonly [string, ...string[]]>(values: T) {
  return z.enum(values, { error: (issue) => (issue.input === undefined ? 'Required' : `Use one of: ${values.join(', ')}`) });
}

/** Stable keys for imports and rate sheets: lower-case words joined by hyphens. */
export const workTypeKeySchema = z
  .string()
  .trim()
  .min(1, 'Required')
  .max(60, 'At most 60 characters')
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'Use lower-case letters, digits and single hyphens, for example "hay-raking"');

const cautionList = z
  .array(oneOf(CAUTION_KEYS))
  .max(CAUTION_KEYS.length)
  .refine((keys) => new Set(keys).size === keys.length, { message: 'A caution is listed twice' });

const workTypeFields = {
  name: singleLineText(80),
  defaultUnit: oneOf(WORK_UNITS),
  cautions: cautionList,
  /** The implement class usually used, for field-capacity plausibility checks. */
  typicalClassId: oneOf(MACHINE_CLASS_IDS).nullish(),
};

export const workTypeCreateSchema = z.strictObject({
  /** Derived from the name when left out. */
  key: workTypeKeySchema.optional(),
  ...workTypeFields,
  cautions: cautionList.default([]),
});
export type WorkTypeCreateInput = z.input<typeof workTypeCreateSchema>;
export type WorkTypeCreate = z.output<typeof workTypeCreateSchema>;

/** The key is fixed once created: imports and rate sheets refer to it. */
export const workTypeUpdateSchema = z
  .strictObject({ ...workTypeFields, archived: z.boolean({ error: 'true or false' }) })
  .partial()
  .refine((patch) => Object.keys(patch).length > 0, { message: 'Nothing to change' });
export type WorkTypeUpdateInput = z.input<typeof workTypeUpdateSchema>;
export type WorkTypeUpdate = z.output<typeof workTypeUpdateSchema>;

export const workTypeListQuerySchema = z.strictObject({
  page: z.coerce.number().int().min(1).max(100000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(100),
  q: searchQuery,
  archived: oneOf(['false', 'true', 'all']).default('false'),
});
export type WorkTypeListQuery = z.output<typeof workTypeListQuerySchema>;

export interface WorkTypeDto {
  id: string;
  key: string;
  name: string;
  defaultUnit: WorkUnit;
  /** Keys into CAUTIONS (packages/shared/src/cautions.ts), shown when the work type is picked. */
  cautions: CautionKey[];
  typicalClassId: MachineClassId | null;
  archived: boolean;
}
