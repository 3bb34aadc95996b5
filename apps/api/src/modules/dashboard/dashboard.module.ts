import { Module } from '@nestjs/common';
import { PartiesModule } from '../parties/parties.module.js';
import { DashboardController } from './dashboard.controller.js';
import { DashboardService } from './dashboard.service.js';

@Module({ imports: [PartiesModule], controllers: [DashboardController], providers: [DashboardService] })
export class DashboardModule {}
