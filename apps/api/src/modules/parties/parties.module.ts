import { Module } from '@nestjs/common';
import { PartiesController } from './parties.controller.js';
import { PartiesRepository } from './parties.repository.js';
import { PartiesService } from './parties.service.js';

@Module({
  controllers: [PartiesController],
  providers: [PartiesService, PartiesRepository],
  exports: [PartiesRepository],
})
export class PartiesModule {}
