import { Module } from '@nestjs/common';
import { AuditController } from './audit.controller.js';
import { AuditRepository } from './audit.repository.js';
import { AuditReadService } from './audit.service.js';

@Module({
  controllers: [AuditController],
  providers: [AuditReadService, AuditRepository],
})
export class AuditModule {}
