import { Controller, Get, Inject } from '@nestjs/common';
import { ROLES } from '@hitchbook/shared/roles';
import type { Actor } from '../../common/auth/actor.js';
import { CurrentActor, Roles } from '../../common/auth/decorators.js';
import { DashboardService, type DashboardCard } from './dashboard.service.js';

@Controller('dashboard')
export class DashboardController {
  constructor(@Inject(DashboardService) private readonly dashboard: DashboardService) {}

  @Roles(...ROLES)
  @Get()
  get(@CurrentActor() actor: Actor): Promise<{ cards: DashboardCard[] }> {
    return this.dashboard.cards(actor);
  }
}
