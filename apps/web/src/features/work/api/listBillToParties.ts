import type { Page } from '@hitchbook/shared/schemas/common';
import { api } from '../../../lib/api';
import { KEEP_FOR_OFFLINE } from '../../offline/networkMode';

export interface BillToParty {
  id: string;
  name: string;
  kind: 'household' | 'customer';
}

export const EVERY_PARTY = { pageSize: 200, sort: 'name' } as const;

/** Work is billed to a household of the outfit (squared up) or to a customer (invoiced). */
export function listBillToParties(signal?: AbortSignal) {
  return api.get<Page<BillToParty>>('/api/parties', { query: EVERY_PARTY, signal, headers: KEEP_FOR_OFFLINE }).then((page) => page.items);
}
