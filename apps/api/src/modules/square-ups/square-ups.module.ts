import { Module } from '@nestjs/common';
import { SquareUpPeriods } from './square-up-periods.js';
import { SquareUpsController } from './square-ups.controller.js';
import { SquareUpsRepository } from './square-ups.repository.js';
import { SquareUpsService } from './square-ups.service.js';
import { StatementRepository } from './statement.repository.js';

@Module({
  controllers: [SquareUpsController],
  providers: [SquareUpsRepository, StatementRepository, SquareUpsService, SquareUpPeriods],
  /** SquareUpPeriods: the closed-period guard for features that write costs and entries; the service: the dashboard's open balance. */
  exports: [SquareUpPeriods, SquareUpsService],
})
export class SquareUpsModule {}
