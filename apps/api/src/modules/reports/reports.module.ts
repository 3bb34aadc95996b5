import { Module } from '@nestjs/common';
import { CustomIncomeRepository } from './custom-income.repository.js';
import { CustomIncomeService } from './custom-income.service.js';
import { MachineRatesService } from './machine-rates.service.js';
import { MachineYearRepository } from './machine-year.repository.js';
import { ReportsController } from './reports.controller.js';
import { SuggestedRatesRepository } from './suggested-rates.repository.js';
import { SuggestedRatesService } from './suggested-rates.service.js';

@Module({
  controllers: [ReportsController],
  providers: [MachineYearRepository, MachineRatesService, SuggestedRatesRepository, SuggestedRatesService, CustomIncomeRepository, CustomIncomeService],
})
export class ReportsModule {}
