import { Body, Controller, Delete, Get, HttpCode, Inject, Param, Patch, Post, Query } from '@nestjs/common';
import { pageQuerySchema, type Page } from '@hitchbook/shared/schemas/common';
import { invitationSchema, membershipUpdateSchema } from '@hitchbook/shared/schemas/users';
import type { z } from 'zod';
import type { Actor } from '../../common/auth/actor.js';
import { CurrentActor, Roles } from '../../common/auth/decorators.js';
import { UuidPipe } from '../../common/validation/uuid.pipe.js';
import { ZodPipe } from '../../common/validation/zod.pipe.js';
import { UsersService, type MemberDto } from './users.service.js';

@Controller('users')
export class UsersController {
  constructor(@Inject(UsersService) private readonly users: UsersService) {}

  @Roles('owner', 'bookkeeper')
  @Get()
  list(@CurrentActor() actor: Actor, @Query(new ZodPipe(pageQuerySchema)) query: z.infer<typeof pageQuerySchema>): Promise<Page<MemberDto>> {
    return this.users.list(actor, query.page, query.pageSize);
  }

  @Roles('owner')
  @Post('invitations')
  invite(@CurrentActor() actor: Actor, @Body(new ZodPipe(invitationSchema)) body: z.infer<typeof invitationSchema>): Promise<MemberDto> {
    return this.users.invite(actor, body);
  }

  @Roles('owner')
  @Patch(':membershipId')
  update(@CurrentActor() actor: Actor, @Param('membershipId', new UuidPipe()) id: string, @Body(new ZodPipe(membershipUpdateSchema)) body: z.infer<typeof membershipUpdateSchema>): Promise<MemberDto> {
    return this.users.update(actor, id, body);
  }

  @Roles('owner')
  @Delete(':membershipId')
  @HttpCode(204)
  async remove(@CurrentActor() actor: Actor, @Param('membershipId', new UuidPipe()) id: string): Promise<void> {
    await this.users.remove(actor, id);
  }
}
