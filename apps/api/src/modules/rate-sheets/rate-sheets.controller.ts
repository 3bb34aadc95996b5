import { Body, Controller, Delete, Get, Inject, Param, Patch, Post, Query } from '@nestjs/common';
import type { Page } from '@hitchbook/shared/schemas/common';
import {
  rateSheetCreateSchema,
  rateSheetInForceQuerySchema,
  rateSheetListQuerySchema,
  rateSheetUpdateSchema,
  type RateSheetCreate,
  type RateSheetDto,
  type RateSheetInForceDto,
  type RateSheetListItemDto,
  type RateSheetListQuery,
  type RateSheetUpdate,
} from '@hitchbook/shared/schemas/rate-sheets';
import type { Actor } from '../../common/auth/actor.js';
import { CurrentActor, Roles } from '../../common/auth/decorators.js';
import { UuidPipe } from '../../common/validation/uuid.pipe.js';
import { ZodPipe } from '../../common/validation/zod.pipe.js';
import { RateSheetsService } from './rate-sheets.service.js';

@Controller('rate-sheets')
export class RateSheetsController {
  constructor(@Inject(RateSheetsService) private readonly sheets: RateSheetsService) {}

  @Roles('owner', 'partner', 'bookkeeper')
  @Get()
  list(@CurrentActor() actor: Actor, @Query(new ZodPipe(rateSheetListQuerySchema)) query: RateSheetListQuery): Promise<Page<RateSheetListItemDto>> {
    return this.sheets.list(actor, query);
  }

  @Roles('owner', 'partner', 'bookkeeper')
  @Get('in-force')
  inForce(@CurrentActor() actor: Actor, @Query(new ZodPipe(rateSheetInForceQuerySchema)) query: { partyId: string; date: string }): Promise<RateSheetInForceDto> {
    return this.sheets.inForce(actor, query.partyId, query.date);
  }

  @Roles('owner', 'partner', 'bookkeeper')
  @Get(':id')
  get(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string): Promise<RateSheetDto> {
    return this.sheets.get(actor, id);
  }

  @Roles('owner')
  @Post()
  create(@CurrentActor() actor: Actor, @Body(new ZodPipe(rateSheetCreateSchema)) body: RateSheetCreate): Promise<RateSheetDto> {
    return this.sheets.create(actor, body);
  }

  @Roles('owner')
  @Patch(':id')
  update(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Body(new ZodPipe(rateSheetUpdateSchema)) body: RateSheetUpdate): Promise<RateSheetDto> {
    return this.sheets.update(actor, id, body);
  }

  /** Archives the sheet: it prices nothing from now on but stays readable. */
  @Roles('owner')
  @Delete(':id')
  archive(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string): Promise<RateSheetDto> {
    return this.sheets.archive(actor, id);
  }
}
