import { type CallHandler, type ExecutionContext, Injectable, type NestInterceptor } from '@nestjs/common';
import { MAX_UPLOAD_BYTES } from '@hitchbook/shared/schemas/machines';
import type { Request, Response } from 'express';
import multer from 'multer';
import { from, type Observable, switchMap } from 'rxjs';
import { AppError, invalid } from '../../common/errors/app-error.js';
import { MULTIPART_OVERHEAD_BYTES } from './upload-kinds.js';

const TOO_LARGE = `A file may be at most ${MAX_UPLOAD_BYTES / (1024 * 1024)} MB.`;

// Multer stops reading a file at the limit, so nothing over it is ever held in memory;
// the other limits keep a form from carrying extra files or oversized fields.
const parseSingleFile = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: MAX_UPLOAD_BYTES, files: 1, fields: 4, fieldSize: 1024, fieldNameSize: 64, parts: 5, headerPairs: 40 },
}).single('file');

function tooLarge(res: Response): AppError {
  // The rest of the body is not wanted: close the connection instead of reading it.
  res.setHeader('Connection', 'close');
  return new AppError('too-large', TOO_LARGE);
}

function asAppError(err: unknown, res: Response): AppError {
  if (err instanceof multer.MulterError) {
    switch (err.code) {
      case 'LIMIT_FILE_SIZE':
        return tooLarge(res);
      case 'LIMIT_UNEXPECTED_FILE':
      case 'LIMIT_FILE_COUNT':
        return invalid(err.field ?? 'file', 'Send exactly one file, in the form field "file".');
      default:
        return invalid(err.field ?? 'purpose', 'The form carries more or longer fields than an upload needs.');
    }
  }
  return new AppError('validation', 'The upload could not be read as multipart/form-data.');
}

/**
 * Reads one multipart file after the auth guard has run. A declared Content-Length over the limit is
 * refused with 413 before a single body byte is read; a body without one is answered 413 as soon as it
 * passes the limit, while Multer keeps at most the limit's worth of file in memory.
 */
@Injectable()
export class SingleFileInterceptor implements NestInterceptor {
  intercept(context: ExecutionContext, next: CallHandler): Observable<unknown> {
    const req = context.switchToHttp().getRequest<Request>();
    const res = context.switchToHttp().getResponse<Response>();
    const declared = Number(req.headers['content-length']);
    if (Number.isFinite(declared) && declared > MAX_UPLOAD_BYTES + MULTIPART_OVERHEAD_BYTES) throw tooLarge(res);
    const parsed = new Promise<void>((resolve, reject) => {
      // Multer reports its own limit only once the whole body has arrived; counting here answers at once.
      let received = 0;
      const countBytes = (chunk: Buffer) => {
        received += chunk.length;
        if (received > MAX_UPLOAD_BYTES + MULTIPART_OVERHEAD_BYTES) {
          req.off('data', countBytes);
          reject(tooLarge(res));
        }
      };
      req.on('data', countBytes);
      parseSingleFile(req, res, (err: unknown) => {
        req.off('data', countBytes);
        if (err) reject(asAppError(err, res));
        else resolve();
      });
    });
    return from(parsed).pipe(switchMap(() => next.handle()));
  }
}
