import { Controller, Get, Inject } from '@nestjs/common';
import { ROLES } from '@hitchbook/shared/roles';
import type { DashboardDto } from '@hitchbook/shared/schemas/reports';
import type { Actor } from '../../common/auth/actor.js';
import { CurrentActor, Roles } from '../../common/auth/decorators.js';
import { DashboardService } from './dashboard.service.js';

@Controller('dashboard')
export class DashboardController {
  constructor(@Inject(DashboardService) private readonly dashboard: DashboardService) {}

  @Roles(...ROLES)
  @Get()
  get(@CurrentActor() actor: Actor): Promise<DashboardDto> {
    return this.dashboard.dashboard(actor);
  }
}
