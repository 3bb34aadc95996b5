import { Controller, Get, Inject, Query } from '@nestjs/common';
import { auditListQuerySchema, type AuditEntryDto, type AuditListQuery } from '@hitchbook/shared/schemas/audit';
import type { Page } from '@hitchbook/shared/schemas/common';
import type { Actor } from '../../common/auth/actor.js';
import { CurrentActor, Roles } from '../../common/auth/decorators.js';
import { ZodPipe } from '../../common/validation/zod.pipe.js';
import { AuditReadService } from './audit.service.js';

@Controller('audit')
export class AuditController {
  constructor(@Inject(AuditReadService) private readonly audit: AuditReadService) {}

  @Roles('owner', 'bookkeeper')
  @Get()
  list(@CurrentActor() actor: Actor, @Query(new ZodPipe(auditListQuerySchema)) query: AuditListQuery): Promise<Page<AuditEntryDto>> {
    return this.audit.list(actor, query);
  }
}
