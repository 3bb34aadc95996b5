import { Module } from '@nestjs/common';
import { FieldsModule } from '../fields/fields.module.js';
import { MachinesModule } from '../machines/machines.module.js';
import { PartiesModule } from '../parties/parties.module.js';
import { SquareUpsModule } from '../square-ups/square-ups.module.js';
import { UploadsModule } from '../uploads/uploads.module.js';
import { WorkTypesModule } from '../work-types/work-types.module.js';
import { EntryPhotosController } from './entry-photos.controller.js';
import { EntryPhotosRepository } from './entry-photos.repository.js';
import { EntryPhotosService } from './entry-photos.service.js';
import { FuelTicketsRepository } from './fuel-tickets.repository.js';
import { ReferencesRepository } from './references.repository.js';
import { WorkEntriesExportService } from './work-entries-export.service.js';
import { WorkEntriesImportService } from './work-entries-import.service.js';
import { WorkEntriesController } from './work-entries.controller.js';
import { WorkEntriesRepository } from './work-entries.repository.js';
import { WorkEntriesService } from './work-entries.service.js';

@Module({
  imports: [MachinesModule, FieldsModule, WorkTypesModule, PartiesModule, UploadsModule, SquareUpsModule],
  controllers: [WorkEntriesController, EntryPhotosController],
  providers: [WorkEntriesService, EntryPhotosService, EntryPhotosRepository, WorkEntriesExportService, WorkEntriesImportService, WorkEntriesRepository, ReferencesRepository, FuelTicketsRepository],
  exports: [WorkEntriesRepository],
})
export class WorkEntriesModule {}
