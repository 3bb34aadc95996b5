import { Body, Controller, Delete, Get, HttpCode, Inject, Param, Patch, Post, Query, type StreamableFile } from '@nestjs/common';
import type { Page } from '@hitchbook/shared/schemas/common';
import {
  machineCreateSchema,
  machineListQuerySchema,
  machineSummaryQuerySchema,
  machineUpdateSchema,
  type MachineCreate,
  type MachineDto,
  type MachineListQuery,
  type MachineSummaryDto,
  type MachineSummaryQuery,
  type MachineUpdate,
} from '@hitchbook/shared/schemas/machines';
import type { Actor } from '../../common/auth/actor.js';
import { CurrentActor, Roles } from '../../common/auth/decorators.js';
import { UuidPipe } from '../../common/validation/uuid.pipe.js';
import { ZodPipe } from '../../common/validation/zod.pipe.js';
import { MachineSummaryService } from './machine-summary.service.js';
import { MachinesService } from './machines.service.js';

@Controller('machines')
export class MachinesController {
  constructor(
    @Inject(MachinesService) private readonly machines: MachinesService,
    @Inject(MachineSummaryService) private readonly summaries: MachineSummaryService,
  ) {}

  @Roles('owner', 'partner', 'operator', 'bookkeeper')
  @Get()
  list(@CurrentActor() actor: Actor, @Query(new ZodPipe(machineListQuerySchema)) query: MachineListQuery): Promise<Page<MachineDto>> {
    return this.machines.list(actor, query);
  }

  // Declared before ':id' so the path is never read as an id.
  @Roles('owner', 'partner', 'operator', 'bookkeeper')
  @Get('export.csv')
  exportCsv(@CurrentActor() actor: Actor, @Query(new ZodPipe(machineListQuerySchema)) query: MachineListQuery): Promise<StreamableFile> {
    return this.machines.exportCsv(actor, query);
  }

  @Roles('owner', 'partner', 'operator', 'bookkeeper')
  @Get(':id')
  get(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string): Promise<MachineDto> {
    return this.machines.get(actor, id);
  }

  @Roles('owner', 'partner', 'operator', 'bookkeeper')
  @Get(':id/summary')
  summary(
    @CurrentActor() actor: Actor,
    @Param('id', new UuidPipe()) id: string,
    @Query(new ZodPipe(machineSummaryQuerySchema)) query: MachineSummaryQuery,
  ): Promise<MachineSummaryDto> {
    return this.summaries.summary(actor, id, query);
  }

  @Roles('owner', 'partner')
  @Post()
  create(@CurrentActor() actor: Actor, @Body(new ZodPipe(machineCreateSchema)) body: MachineCreate): Promise<MachineDto> {
    return this.machines.create(actor, body);
  }

  @Roles('owner', 'partner')
  @Patch(':id')
  update(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Body(new ZodPipe(machineUpdateSchema)) body: MachineUpdate): Promise<MachineDto> {
    return this.machines.update(actor, id, body);
  }

  @Roles('owner', 'partner')
  @Delete(':id')
  @HttpCode(204)
  delete(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string): Promise<void> {
    return this.machines.delete(actor, id);
  }
}
