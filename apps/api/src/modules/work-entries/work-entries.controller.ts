import { Body, Controller, Delete, Get, HttpCode, Inject, Param, Patch, Post, Query, Req, Res, type StreamableFile, UseInterceptors } from '@nestjs/common';
import type { Request, Response } from 'express';
import {
  IMPORT_MAX_BYTES,
  workEntryCreateSchema,
  workEntryFilterSchema,
  workEntryImportQuerySchema,
  workEntryListQuerySchema,
  workEntryTransitionSchema,
  workEntryUpdateSchema,
  type ImportReport,
  type WorkEntryCreateInput,
  type WorkEntryFilter,
  type WorkEntryListQuery,
  type WorkEntryPage,
  type WorkEntryTransitionInput,
  type WorkEntryUpdateInput,
  type WorkEntryWithWarnings,
} from '@hitchbook/shared/schemas/work-entries';
import type { z } from 'zod';
import type { Actor } from '../../common/auth/actor.js';
import { CurrentActor, Roles } from '../../common/auth/decorators.js';
import { CsvUpload } from '../../common/csv/csv-upload.js';
import { UuidPipe } from '../../common/validation/uuid.pipe.js';
import { ZodPipe } from '../../common/validation/zod.pipe.js';
import { WorkEntriesExportService } from './work-entries-export.service.js';
import { WorkEntriesImportService } from './work-entries-import.service.js';
import { WorkEntriesService } from './work-entries.service.js';
import { KeptUntilDataChanges } from '../../common/http/read-cache.js';

// Customers never reach these routes: they see entries only through their invoices.
@Controller('work-entries')
export class WorkEntriesController {
  constructor(
    @Inject(WorkEntriesService) private readonly entries: WorkEntriesService,
    @Inject(WorkEntriesExportService) private readonly exports: WorkEntriesExportService,
    @Inject(WorkEntriesImportService) private readonly imports: WorkEntriesImportService,
  ) {}

  @Roles('owner', 'partner', 'operator', 'bookkeeper')
  @KeptUntilDataChanges()
  @Get()
  list(@CurrentActor() actor: Actor, @Query(new ZodPipe(workEntryListQuerySchema)) query: WorkEntryListQuery): Promise<WorkEntryPage> {
    return this.entries.list(actor, query);
  }

  // Declared before ':id' so the path is never read as an id.
  @Roles('owner', 'partner', 'operator', 'bookkeeper')
  @Get('export.csv')
  exportCsv(@CurrentActor() actor: Actor, @Query(new ZodPipe(workEntryFilterSchema)) filter: WorkEntryFilter): Promise<StreamableFile> {
    return this.exports.exportCsv(actor, filter);
  }

  @Roles('owner', 'partner')
  @Post('import')
  @UseInterceptors(CsvUpload(IMPORT_MAX_BYTES))
  async import(
    @CurrentActor() actor: Actor,
    @Query(new ZodPipe(workEntryImportQuerySchema)) query: z.infer<typeof workEntryImportQuerySchema>,
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<ImportReport> {
    const outcome = await this.imports.run(actor, query.kind, query.mode, req.file!.buffer);
    res.status(outcome.status);
    return outcome.body;
  }

  @Roles('owner', 'partner', 'operator', 'bookkeeper')
  @Get(':id')
  get(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string): Promise<WorkEntryWithWarnings> {
    return this.entries.get(actor, id);
  }

  /** 201 for a new entry; 200 with the stored one when the same clientId is sent again. */
  @Roles('owner', 'partner', 'operator')
  @Post()
  async create(@CurrentActor() actor: Actor, @Body(new ZodPipe(workEntryCreateSchema)) body: WorkEntryCreateInput, @Res({ passthrough: true }) res: Response): Promise<WorkEntryWithWarnings> {
    const { entry, created } = await this.entries.create(actor, body);
    res.status(created ? 201 : 200);
    return entry;
  }

  @Roles('owner', 'partner', 'operator')
  @Patch(':id')
  update(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Body(new ZodPipe(workEntryUpdateSchema)) body: WorkEntryUpdateInput): Promise<WorkEntryWithWarnings> {
    return this.entries.update(actor, id, body);
  }

  @Roles('owner', 'partner', 'operator')
  @Post(':id/submit')
  @HttpCode(200)
  submit(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Body(new ZodPipe(workEntryTransitionSchema)) body: WorkEntryTransitionInput): Promise<WorkEntryWithWarnings> {
    return this.entries.submit(actor, id, body);
  }

  @Roles('owner', 'partner')
  @Post(':id/approve')
  @HttpCode(200)
  approve(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Body(new ZodPipe(workEntryTransitionSchema)) body: WorkEntryTransitionInput): Promise<WorkEntryWithWarnings> {
    return this.entries.approve(actor, id, body);
  }

  @Roles('owner', 'partner')
  @Post(':id/reopen')
  @HttpCode(200)
  reopen(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Body(new ZodPipe(workEntryTransitionSchema)) body: WorkEntryTransitionInput): Promise<WorkEntryWithWarnings> {
    return this.entries.reopen(actor, id, body);
  }

  @Roles('owner', 'partner', 'operator')
  @Delete(':id')
  @HttpCode(204)
  remove(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string): Promise<void> {
    return this.entries.remove(actor, id);
  }
}
