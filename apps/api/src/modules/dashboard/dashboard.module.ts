import { Module } from '@nestjs/common';
import { InvoicesModule } from '../invoices/invoices.module.js';
import { PartiesModule } from '../parties/parties.module.js';
import { SquareUpsModule } from '../square-ups/square-ups.module.js';
import { DashboardController } from './dashboard.controller.js';
import { DashboardRepository } from './dashboard.repository.js';
import { DashboardService } from './dashboard.service.js';

@Module({ imports: [PartiesModule, InvoicesModule, SquareUpsModule], controllers: [DashboardController], providers: [DashboardService, DashboardRepository] })
export class DashboardModule {}
