import { Module } from '@nestjs/common';
import { WorkTypesController } from './work-types.controller.js';
import { WorkTypesRepository } from './work-types.repository.js';
import { WorkTypesService } from './work-types.service.js';

@Module({
  controllers: [WorkTypesController],
  providers: [WorkTypesService, WorkTypesRepository],
  exports: [WorkTypesRepository],
})
export class WorkTypesModule {}
