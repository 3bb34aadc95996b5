import { Body, Controller, Get, Inject, Param, Patch, Post, Query, type StreamableFile } from '@nestjs/common';
import type { Page } from '@hitchbook/shared/schemas/common';
import {
  fieldCreateSchema,
  fieldListQuerySchema,
  fieldUpdateSchema,
  type FieldCreate,
  type FieldDto,
  type FieldListQuery,
  type FieldUpdate,
} from '@hitchbook/shared/schemas/fields';
import type { Actor } from '../../common/auth/actor.js';
import { CurrentActor, Roles } from '../../common/auth/decorators.js';
import { UuidPipe } from '../../common/validation/uuid.pipe.js';
import { ZodPipe } from '../../common/validation/zod.pipe.js';
import { FieldsService } from './fields.service.js';

@Controller('fields')
export class FieldsController {
  constructor(@Inject(FieldsService) private readonly fields: FieldsService) {}

  @Roles('owner', 'partner', 'operator', 'bookkeeper')
  @Get()
  list(@CurrentActor() actor: Actor, @Query(new ZodPipe(fieldListQuerySchema)) query: FieldListQuery): Promise<Page<FieldDto>> {
    return this.fields.list(actor, query);
  }

  // Declared before ':id' so the path is never read as an id.
  @Roles('owner', 'partner', 'operator', 'bookkeeper')
  @Get('export.csv')
  exportCsv(@CurrentActor() actor: Actor, @Query(new ZodPipe(fieldListQuerySchema)) query: FieldListQuery): Promise<StreamableFile> {
    return this.fields.exportCsv(actor, query);
  }

  @Roles('owner', 'partner', 'operator', 'bookkeeper')
  @Get(':id')
  get(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string): Promise<FieldDto> {
    return this.fields.get(actor, id);
  }

  @Roles('owner', 'partner')
  @Post()
  create(@CurrentActor() actor: Actor, @Body(new ZodPipe(fieldCreateSchema)) body: FieldCreate): Promise<FieldDto> {
    return this.fields.create(actor, body);
  }

  @Roles('owner', 'partner')
  @Patch(':id')
  update(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Body(new ZodPipe(fieldUpdateSchema)) body: FieldUpdate): Promise<FieldDto> {
    return this.fields.update(actor, id, body);
  }
}
