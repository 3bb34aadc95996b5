import type { Role } from '@hitchbook/shared/roles';

/** The signed-in person as the server resolved them for this request (role read fresh from the database). */
export interface Actor {
  userId: string;
  email: string;
  name: string;
  membershipId: string;
  sessionId: string;
  operationId: string;
  operationName: string;
  role: Role;
  /** The household (or, for customers, the customer party) this member stands for. */
  partyId: string | null;
  /**
   * The operation's data version, read with the role before anything else the request reads, so an answer
   * computed afterwards is never older than the version it is kept under (common/http/read-cache.ts).
   */
  dataVersion?: string;
}

export interface RequestWithActor {
  actor?: Actor;
  requestId?: string;
  ip?: string;
}
