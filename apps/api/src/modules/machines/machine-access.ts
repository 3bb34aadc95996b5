import { Inject, Injectable } from '@nestjs/common';
import type { Executor, Machine } from '@hitchbook/db';
import { MONEY_ROLES, STAFF_ROLES } from '@hitchbook/shared/roles';
import type { Actor } from '../../common/auth/actor.js';
import { forbidden, notFound } from '../../common/errors/app-error.js';
import { todayIso } from './calendar.js';
import { MachinesRepository } from './machines.repository.js';
import { SharesRepository } from './shares.repository.js';

/**
 * What one may do with an existing machine:
 * - `machine.read`: the machine, its owners and meter history (money fields only for money roles).
 * - `money.read`: its costs and rates (owner, partner, bookkeeper).
 * - `meter.record`: add a meter reading (owner, partner, operator: reading a meter is cab work, not a money decision).
 * - `machine.change`: edit it, its owners and its costs, or delete it. The owner always; a partner only
 *   while its household holds a share in the set in force today or in a later-dated one; the bookkeeper never.
 */
export type MachinePermission = 'machine.read' | 'money.read' | 'meter.record' | 'machine.change';

/**
 * The one record-level access check for machines, called first by every machine service. A machine of
 * another operation is 404; a known machine the role may not touch is 403. Adding a machine is open to
 * the owner and to partners, who then own it themselves (see MachinesService.create).
 */
@Injectable()
export class MachineAccess {
  constructor(
    @Inject(MachinesRepository) private readonly machines: MachinesRepository,
    @Inject(SharesRepository) private readonly shares: SharesRepository,
  ) {}

  async machineOrThrow(actor: Actor, permission: MachinePermission, machineId: string, executor?: Executor): Promise<Machine> {
    const machine = await this.machines.find(actor.operationId, machineId, executor);
    if (!machine) throw notFound('No such machine.');
    if (!(await this.allows(actor, permission, machine.id, executor))) {
      throw forbidden(permission === 'machine.change' && actor.role === 'partner' ? 'Only the owning households may change this machine.' : undefined);
    }
    return machine;
  }

  seesMoney(actor: Actor): boolean {
    return MONEY_ROLES.includes(actor.role);
  }

  private async allows(actor: Actor, permission: MachinePermission, machineId: string, executor?: Executor): Promise<boolean> {
    switch (permission) {
      case 'machine.read':
        return STAFF_ROLES.includes(actor.role);
      case 'money.read':
        return MONEY_ROLES.includes(actor.role);
      case 'meter.record':
        return actor.role === 'owner' || actor.role === 'partner' || actor.role === 'operator';
      case 'machine.change':
        if (actor.role === 'owner') return true;
        if (actor.role !== 'partner' || !actor.partyId) return false;
        return this.shares.holdsShare(actor.operationId, machineId, actor.partyId, todayIso(), executor);
    }
  }
}
