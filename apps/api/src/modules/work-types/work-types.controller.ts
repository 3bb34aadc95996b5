import { Body, Controller, Get, Inject, Param, Patch, Post, Query } from '@nestjs/common';
import type { Page } from '@hitchbook/shared/schemas/common';
import {
  workTypeCreateSchema,
  workTypeListQuerySchema,
  workTypeUpdateSchema,
  type WorkTypeCreate,
  type WorkTypeDto,
  type WorkTypeListQuery,
  type WorkTypeUpdate,
} from '@hitchbook/shared/schemas/work-types';
import type { Actor } from '../../common/auth/actor.js';
import { CurrentActor, Roles } from '../../common/auth/decorators.js';
import { UuidPipe } from '../../common/validation/uuid.pipe.js';
import { ZodPipe } from '../../common/validation/zod.pipe.js';
import { WorkTypesService } from './work-types.service.js';

@Controller('work-types')
export class WorkTypesController {
  constructor(@Inject(WorkTypesService) private readonly workTypes: WorkTypesService) {}

  @Roles('owner', 'partner', 'operator', 'bookkeeper')
  @Get()
  list(@CurrentActor() actor: Actor, @Query(new ZodPipe(workTypeListQuerySchema)) query: WorkTypeListQuery): Promise<Page<WorkTypeDto>> {
    return this.workTypes.list(actor, query);
  }

  @Roles('owner', 'partner', 'operator', 'bookkeeper')
  @Get(':id')
  get(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string): Promise<WorkTypeDto> {
    return this.workTypes.get(actor, id);
  }

  @Roles('owner', 'partner')
  @Post()
  create(@CurrentActor() actor: Actor, @Body(new ZodPipe(workTypeCreateSchema)) body: WorkTypeCreate): Promise<WorkTypeDto> {
    return this.workTypes.create(actor, body);
  }

  @Roles('owner', 'partner')
  @Patch(':id')
  update(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Body(new ZodPipe(workTypeUpdateSchema)) body: WorkTypeUpdate): Promise<WorkTypeDto> {
    return this.workTypes.update(actor, id, body);
  }
}
