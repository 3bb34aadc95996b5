import { Body, Controller, Delete, Get, HttpCode, Inject, Param, Patch, Post, Query, type StreamableFile } from '@nestjs/common';
import {
  costEntryCreateSchema,
  costEntryListQuerySchema,
  costEntryUpdateSchema,
  type CostEntryCreate,
  type CostEntryDto,
  type CostEntryListQuery,
  type CostEntryPage,
  type CostEntryUpdate,
} from '@hitchbook/shared/schemas/machines';
import type { Actor } from '../../common/auth/actor.js';
import { CurrentActor, Roles } from '../../common/auth/decorators.js';
import { UuidPipe } from '../../common/validation/uuid.pipe.js';
import { ZodPipe } from '../../common/validation/zod.pipe.js';
import { CostEntriesService } from './cost-entries.service.js';

@Controller('machines/:id/costs')
export class CostEntriesController {
  constructor(@Inject(CostEntriesService) private readonly costs: CostEntriesService) {}

  @Roles('owner', 'partner', 'bookkeeper')
  @Get()
  list(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Query(new ZodPipe(costEntryListQuerySchema)) query: CostEntryListQuery): Promise<CostEntryPage> {
    return this.costs.list(actor, id, query);
  }

  // Declared before ':costId' so the path is never read as an id.
  @Roles('owner', 'partner', 'bookkeeper')
  @Get('export.csv')
  exportCsv(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Query(new ZodPipe(costEntryListQuerySchema)) query: CostEntryListQuery): Promise<StreamableFile> {
    return this.costs.exportCsv(actor, id, query);
  }

  @Roles('owner', 'partner', 'bookkeeper')
  @Get(':costId')
  get(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Param('costId', new UuidPipe()) costId: string): Promise<CostEntryDto> {
    return this.costs.get(actor, id, costId);
  }

  @Roles('owner', 'partner')
  @Post()
  create(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Body(new ZodPipe(costEntryCreateSchema)) body: CostEntryCreate): Promise<CostEntryDto> {
    return this.costs.create(actor, id, body);
  }

  @Roles('owner', 'partner')
  @Patch(':costId')
  update(
    @CurrentActor() actor: Actor,
    @Param('id', new UuidPipe()) id: string,
    @Param('costId', new UuidPipe()) costId: string,
    @Body(new ZodPipe(costEntryUpdateSchema)) body: CostEntryUpdate,
  ): Promise<CostEntryDto> {
    return this.costs.update(actor, id, costId, body);
  }

  @Roles('owner', 'partner')
  @Delete(':costId')
  @HttpCode(204)
  delete(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Param('costId', new UuidPipe()) costId: string): Promise<void> {
    return this.costs.delete(actor, id, costId);
  }
}
