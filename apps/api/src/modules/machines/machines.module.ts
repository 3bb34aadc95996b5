import { Module } from '@nestjs/common';
import { PartiesModule } from '../parties/parties.module.js';
import { SquareUpsModule } from '../square-ups/square-ups.module.js';
import { UploadsModule } from '../uploads/uploads.module.js';
import { CostEntriesController } from './cost-entries.controller.js';
import { CostEntriesRepository } from './cost-entries.repository.js';
import { CostEntriesService } from './cost-entries.service.js';
import { MachineAccess } from './machine-access.js';
import { MachineSharesController } from './machine-shares.controller.js';
import { MachineSummaryService } from './machine-summary.service.js';
import { MachineUsageRepository } from './machine-usage.repository.js';
import { MachinesController } from './machines.controller.js';
import { MachinesRepository } from './machines.repository.js';
import { MachinesService } from './machines.service.js';
import { MeterReadingsController } from './meter-readings.controller.js';
import { MeterReadingsRepository } from './meter-readings.repository.js';
import { MeterReadingsService } from './meter-readings.service.js';
import { SharesRepository } from './shares.repository.js';
import { SharesService } from './shares.service.js';

/**
 * Machines, their owners, meter readings and costs. Other features use the exports: shares in force
 * on a day (SharesRepository), hours and acres in a period (MachineUsageRepository), recording a meter
 * reading inside their own transaction (MeterReadingsService.recordOrThrow, MeterReadingsRepository for
 * the last reading), the access check (MachineAccess) and the published-method estimate for a machine
 * (MachineSummaryService.estimatedRate).
 */
@Module({
  imports: [PartiesModule, UploadsModule, SquareUpsModule],
  controllers: [MachinesController, MachineSharesController, MeterReadingsController, CostEntriesController],
  providers: [
    MachineAccess,
    MachinesRepository,
    MachinesService,
    SharesRepository,
    SharesService,
    MeterReadingsRepository,
    MeterReadingsService,
    MachineUsageRepository,
    CostEntriesRepository,
    CostEntriesService,
    MachineSummaryService,
  ],
  exports: [MachineAccess, MachinesRepository, SharesRepository, MachineUsageRepository, MeterReadingsRepository, MeterReadingsService, CostEntriesRepository, MachineSummaryService],
})
export class MachinesModule {}
