import type { DbHandle } from '@hitchbook/db';

export const DB = Symbol('DB');
export type { DbHandle };
