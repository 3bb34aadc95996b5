import { Body, Controller, Get, HttpCode, Inject, Param, Post, StreamableFile, UploadedFile, UseInterceptors } from '@nestjs/common';
import { uploadFieldsSchema, type UploadDto } from '@hitchbook/shared/schemas/machines';
import type { z } from 'zod';
import type { Actor } from '../../common/auth/actor.js';
import { CurrentActor, Roles } from '../../common/auth/decorators.js';
import { UuidPipe } from '../../common/validation/uuid.pipe.js';
import { ZodPipe } from '../../common/validation/zod.pipe.js';
import { SingleFileInterceptor } from './single-file.interceptor.js';
import { UploadsService, type ReceivedFile } from './uploads.service.js';

@Controller('uploads')
export class UploadsController {
  constructor(@Inject(UploadsService) private readonly uploads: UploadsService) {}

  @Roles('owner', 'partner', 'operator')
  @Post()
  @HttpCode(201)
  @UseInterceptors(SingleFileInterceptor)
  create(
    @CurrentActor() actor: Actor,
    @UploadedFile() file: ReceivedFile | undefined,
    @Body(new ZodPipe(uploadFieldsSchema)) body: z.infer<typeof uploadFieldsSchema>,
  ): Promise<UploadDto> {
    return this.uploads.create(actor, body.purpose, file);
  }

  @Roles('owner', 'partner', 'operator', 'bookkeeper')
  @Get(':id')
  async download(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string): Promise<StreamableFile> {
    const file = await this.uploads.download(actor, id);
    return new StreamableFile(file.stream, { type: file.contentType, length: file.length, disposition: file.disposition });
  }
}
