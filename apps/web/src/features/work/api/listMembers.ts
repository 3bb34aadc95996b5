import type { Role } from '@hitchbook/shared/roles';
import type { Page } from '@hitchbook/shared/schemas/common';
import { api } from '../../../lib/api';
import { KEEP_FOR_OFFLINE } from '../../offline/networkMode';

export interface Member {
  userId: string;
  name: string;
  role: Role;
  status: 'active' | 'invited';
}

/** The members list is open to the owner and the bookkeeper only; other roles never ask for it. */
export const MEMBER_READERS: readonly Role[] = ['owner', 'bookkeeper'];

const LOGGERS: readonly Role[] = ['owner', 'partner', 'operator'];

export function listMembers(signal?: AbortSignal) {
  return api.get<Page<Member>>('/api/users', { query: { pageSize: 200 }, signal, headers: KEEP_FOR_OFFLINE }).then((page) => page.items);
}

/** The people who can run a machine: owners, partners and operators who have signed in. */
export function activeOperators(members: readonly Member[]): Member[] {
  return members.filter((m) => LOGGERS.includes(m.role) && m.status === 'active');
}
