import { Body, Controller, Get, Inject, Param, Patch, Post, Query } from '@nestjs/common';
import type { Page } from '@hitchbook/shared/schemas/common';
import { partyListQuerySchema, partySchema, partyUpdateSchema } from '@hitchbook/shared/schemas/users';
import type { z } from 'zod';
import type { Actor } from '../../common/auth/actor.js';
import { CurrentActor, Roles } from '../../common/auth/decorators.js';
import { UuidPipe } from '../../common/validation/uuid.pipe.js';
import { ZodPipe } from '../../common/validation/zod.pipe.js';
import { PartiesService, type PartyDto } from './parties.service.js';

@Controller('parties')
export class PartiesController {
  constructor(@Inject(PartiesService) private readonly parties: PartiesService) {}

  @Roles('owner', 'partner', 'operator', 'bookkeeper')
  @Get()
  list(@CurrentActor() actor: Actor, @Query(new ZodPipe(partyListQuerySchema)) query: z.infer<typeof partyListQuerySchema>): Promise<Page<PartyDto>> {
    return this.parties.list(actor, query);
  }

  @Roles('owner', 'partner', 'operator', 'bookkeeper')
  @Get(':id')
  get(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string): Promise<PartyDto> {
    return this.parties.get(actor, id);
  }

  @Roles('owner', 'partner')
  @Post()
  create(@CurrentActor() actor: Actor, @Body(new ZodPipe(partySchema)) body: z.infer<typeof partySchema>): Promise<PartyDto> {
    return this.parties.create(actor, body);
  }

  @Roles('owner', 'partner')
  @Patch(':id')
  update(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Body(new ZodPipe(partyUpdateSchema)) body: z.infer<typeof partyUpdateSchema>): Promise<PartyDto> {
    return this.parties.update(actor, id, body);
  }
}
