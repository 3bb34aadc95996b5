import { Controller, Delete, Get, HttpCode, Inject, Param, Post, StreamableFile, UploadedFile, UseInterceptors } from '@nestjs/common';
import type { WorkEntryPhotoDto } from '@hitchbook/shared/schemas/work-entries';
import type { Actor } from '../../common/auth/actor.js';
import { CurrentActor, Roles } from '../../common/auth/decorators.js';
import { UuidPipe } from '../../common/validation/uuid.pipe.js';
import { SingleFileInterceptor } from '../uploads/single-file.interceptor.js';
import type { ReceivedFile } from '../uploads/uploads.service.js';
import { EntryPhotosService } from './entry-photos.service.js';

// Customers never reach these routes, like the entries themselves.
@Controller('work-entries/:id/photos')
export class EntryPhotosController {
  constructor(@Inject(EntryPhotosService) private readonly photos: EntryPhotosService) {}

  @Roles('owner', 'partner', 'operator', 'bookkeeper')
  @Get()
  list(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string): Promise<WorkEntryPhotoDto[]> {
    return this.photos.list(actor, id);
  }

  /** A JPEG or PNG in the multipart field "file" (content checked, at most 10 MB). */
  @Roles('owner', 'partner', 'operator')
  @Post()
  @HttpCode(201)
  @UseInterceptors(SingleFileInterceptor)
  attach(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @UploadedFile() file: ReceivedFile | undefined): Promise<WorkEntryPhotoDto> {
    return this.photos.attach(actor, id, file);
  }

  @Roles('owner', 'partner', 'operator', 'bookkeeper')
  @Get(':uploadId')
  async download(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Param('uploadId', new UuidPipe()) uploadId: string): Promise<StreamableFile> {
    const file = await this.photos.download(actor, id, uploadId);
    return new StreamableFile(file.stream, { type: file.contentType, length: file.length, disposition: file.disposition });
  }

  @Roles('owner', 'partner', 'operator')
  @Delete(':uploadId')
  @HttpCode(204)
  remove(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Param('uploadId', new UuidPipe()) uploadId: string): Promise<void> {
    return this.photos.remove(actor, id, uploadId);
  }
}
