import { Module } from '@nestjs/common';
import { APP_CONFIG, type AppConfig } from '../../core/config.js';
import { LocalDiskStorage } from './local-disk-storage.js';
import { UPLOAD_STORAGE } from './upload-storage.js';
import { UploadsController } from './uploads.controller.js';
import { UploadsRepository } from './uploads.repository.js';
import { UploadsService } from './uploads.service.js';

@Module({
  controllers: [UploadsController],
  providers: [
    UploadsService,
    UploadsRepository,
    {
      provide: UPLOAD_STORAGE,
      inject: [APP_CONFIG],
      useFactory: (config: AppConfig) => new LocalDiskStorage(config.uploadDir, config.webDist ? [config.webDist] : []),
    },
  ],
  exports: [UploadsService],
})
export class UploadsModule {}
