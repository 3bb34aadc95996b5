import { Module } from '@nestjs/common';
import { RateSheetsController } from './rate-sheets.controller.js';
import { RateSheetsRepository } from './rate-sheets.repository.js';
import { RateSheetsService } from './rate-sheets.service.js';

@Module({
  controllers: [RateSheetsController],
  providers: [RateSheetsService, RateSheetsRepository],
  exports: [RateSheetsRepository],
})
export class RateSheetsModule {}
