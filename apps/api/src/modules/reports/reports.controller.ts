import { Body, Controller, Get, HttpCode, Inject, Post, Query, type StreamableFile } from '@nestjs/common';
import {
  acceptSuggestedRatesSchema,
  customIncomeQuerySchema,
  machineRatesQuerySchema,
  type AcceptedRatesDto,
  type AcceptSuggestedRates,
  type CustomIncomeQuery,
  type CustomIncomeReportDto,
  type MachineHoursHistoryDto,
  type MachineRatesQuery,
  type MachineRatesReportDto,
} from '@hitchbook/shared/schemas/reports';
import type { Actor } from '../../common/auth/actor.js';
import { CurrentActor, Roles } from '../../common/auth/decorators.js';
import { ZodPipe } from '../../common/validation/zod.pipe.js';
import { CustomIncomeService } from './custom-income.service.js';
import { MachineRatesService } from './machine-rates.service.js';
import { SuggestedRatesService } from './suggested-rates.service.js';
import { KeptUntilDataChanges } from '../../common/http/read-cache.js';

/** Year-end figures are money throughout: the money roles read them, the owner alone sets next year's rates. */
@Controller('reports')
export class ReportsController {
  constructor(
    @Inject(MachineRatesService) private readonly rates: MachineRatesService,
    @Inject(SuggestedRatesService) private readonly suggested: SuggestedRatesService,
    @Inject(CustomIncomeService) private readonly income: CustomIncomeService,
  ) {}

  @Roles('owner', 'partner', 'bookkeeper')
  @KeptUntilDataChanges()
  @Get('machine-rates')
  machineRates(@CurrentActor() actor: Actor, @Query(new ZodPipe(machineRatesQuerySchema)) query: MachineRatesQuery): Promise<MachineRatesReportDto> {
    return this.rates.report(actor.operationId, query);
  }

  @Roles('owner', 'partner', 'bookkeeper')
  @Get('machine-rates.csv')
  machineRatesCsv(@CurrentActor() actor: Actor, @Query(new ZodPipe(machineRatesQuerySchema)) query: MachineRatesQuery): Promise<StreamableFile> {
    return this.rates.reportCsv(actor.operationId, query);
  }

  @Roles('owner', 'partner', 'bookkeeper')
  @Get('machine-rates.pdf')
  machineRatesPdf(@CurrentActor() actor: Actor, @Query(new ZodPipe(machineRatesQuerySchema)) query: MachineRatesQuery): Promise<StreamableFile> {
    return this.rates.reportPdf(actor.operationId, actor.operationName, query);
  }

  @Roles('owner')
  @Post('machine-rates/accept')
  @HttpCode(201)
  accept(@CurrentActor() actor: Actor, @Body(new ZodPipe(acceptSuggestedRatesSchema)) body: AcceptSuggestedRates): Promise<AcceptedRatesDto> {
    return this.suggested.accept(actor, body);
  }

  @Roles('owner', 'partner', 'bookkeeper')
  @Get('machine-hours')
  machineHours(@CurrentActor() actor: Actor): Promise<MachineHoursHistoryDto> {
    return this.rates.history(actor.operationId);
  }

  @Roles('owner', 'partner', 'bookkeeper')
  @Get('custom-income')
  customIncome(@CurrentActor() actor: Actor, @Query(new ZodPipe(customIncomeQuerySchema)) query: CustomIncomeQuery): Promise<CustomIncomeReportDto> {
    return this.income.report(actor.operationId, query.year);
  }

  @Roles('owner', 'partner', 'bookkeeper')
  @Get('custom-income.csv')
  customIncomeCsv(@CurrentActor() actor: Actor, @Query(new ZodPipe(customIncomeQuerySchema)) query: CustomIncomeQuery): Promise<StreamableFile> {
    return this.income.reportCsv(actor.operationId, query.year);
  }
}
