import { Module } from '@nestjs/common';
import { PartiesModule } from '../parties/parties.module.js';
import { UploadsModule } from '../uploads/uploads.module.js';
import { FieldsController } from './fields.controller.js';
import { FieldsRepository } from './fields.repository.js';
import { FieldsService } from './fields.service.js';

@Module({
  imports: [PartiesModule, UploadsModule],
  controllers: [FieldsController],
  providers: [FieldsService, FieldsRepository],
  exports: [FieldsRepository],
})
export class FieldsModule {}
