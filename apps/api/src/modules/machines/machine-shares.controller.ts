import { Body, Controller, Get, Inject, Param, Put, Query } from '@nestjs/common';
import { machineSharesPutSchema, machineSharesQuerySchema, type MachineSharesDto, type MachineSharesPut } from '@hitchbook/shared/schemas/machines';
import type { z } from 'zod';
import type { Actor } from '../../common/auth/actor.js';
import { CurrentActor, Roles } from '../../common/auth/decorators.js';
import { UuidPipe } from '../../common/validation/uuid.pipe.js';
import { ZodPipe } from '../../common/validation/zod.pipe.js';
import { SharesService } from './shares.service.js';

@Controller('machines/:id/shares')
export class MachineSharesController {
  constructor(@Inject(SharesService) private readonly shares: SharesService) {}

  @Roles('owner', 'partner', 'operator', 'bookkeeper')
  @Get()
  get(
    @CurrentActor() actor: Actor,
    @Param('id', new UuidPipe()) id: string,
    @Query(new ZodPipe(machineSharesQuerySchema)) query: z.output<typeof machineSharesQuerySchema>,
  ): Promise<MachineSharesDto> {
    return this.shares.get(actor, id, query.on);
  }

  @Roles('owner', 'partner')
  @Put()
  put(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Body(new ZodPipe(machineSharesPutSchema)) body: MachineSharesPut): Promise<MachineSharesDto> {
    return this.shares.put(actor, id, body);
  }
}
