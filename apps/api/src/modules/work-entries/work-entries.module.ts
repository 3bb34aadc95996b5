import { Module } from '@nestjs/common';
import { FieldsModule } from '../fields/fields.module.js';
import { MachinesModule } from '../machines/machines.module.js';
import { PartiesModule } from '../parties/parties.module.js';
import { WorkTypesModule } from '../work-types/work-types.module.js';
import { FuelTicketsRepository } from './fuel-tickets.repository.js';
import { ReferencesRepository } from './references.repository.js';
import { WorkEntriesExportService } from './work-entries-export.service.js';
import { WorkEntriesImportService } from './work-entries-import.service.js';
import { WorkEntriesController } from './work-entries.controller.js';
import { WorkEntriesRepository } from './work-entries.repository.js';
import { WorkEntriesService } from './work-entries.service.js';

@Module({
  imports: [MachinesModule, FieldsModule, WorkTypesModule, PartiesModule],
  controllers: [WorkEntriesController],
  providers: [WorkEntriesService, WorkEntriesExportService, WorkEntriesImportService, WorkEntriesRepository, ReferencesRepository, FuelTicketsRepository],
  exports: [WorkEntriesRepository],
})
export class WorkEntriesModule {}
