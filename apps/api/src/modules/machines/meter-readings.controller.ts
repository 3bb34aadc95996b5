import { Body, Controller, Get, Inject, Param, Post, Query } from '@nestjs/common';
import type { Page } from '@hitchbook/shared/schemas/common';
import { meterReadingCreateSchema, meterReadingListQuerySchema, type MeterReadingCreate, type MeterReadingDto } from '@hitchbook/shared/schemas/machines';
import type { z } from 'zod';
import type { Actor } from '../../common/auth/actor.js';
import { CurrentActor, Roles } from '../../common/auth/decorators.js';
import { UuidPipe } from '../../common/validation/uuid.pipe.js';
import { ZodPipe } from '../../common/validation/zod.pipe.js';
import { MeterReadingsService } from './meter-readings.service.js';

@Controller('machines/:id/meter-readings')
export class MeterReadingsController {
  constructor(@Inject(MeterReadingsService) private readonly readings: MeterReadingsService) {}

  @Roles('owner', 'partner', 'operator', 'bookkeeper')
  @Get()
  list(
    @CurrentActor() actor: Actor,
    @Param('id', new UuidPipe()) id: string,
    @Query(new ZodPipe(meterReadingListQuerySchema)) query: z.output<typeof meterReadingListQuerySchema>,
  ): Promise<Page<MeterReadingDto>> {
    return this.readings.list(actor, id, query);
  }

  @Roles('owner', 'partner', 'operator')
  @Post()
  create(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Body(new ZodPipe(meterReadingCreateSchema)) body: MeterReadingCreate): Promise<MeterReadingDto> {
    return this.readings.create(actor, id, body);
  }
}
