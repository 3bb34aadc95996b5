import { type CallHandler, type ExecutionContext, Injectable, type NestInterceptor, type Type, mixin } from '@nestjs/common';
import type { Request, Response } from 'express';
import multer from 'multer';
import type { Observable } from 'rxjs';
import { AppError, invalid } from '../errors/app-error.js';

/** Room for the multipart boundaries and part headers around the file itself. */
const MULTIPART_SLACK_BYTES = 64 * 1024;

function tooLarge(maxBytes: number): AppError {
  return new AppError('too-large', `The file is larger than ${Math.round(maxBytes / (1024 * 1024))} MB; split it into smaller files.`, [
    { path: 'file', message: `At most ${Math.round(maxBytes / (1024 * 1024))} MB.` },
  ]);
}

function multerFailure(err: unknown, maxBytes: number): AppError {
  const code = (err as { code?: unknown }).code;
  if (code === 'LIMIT_FILE_SIZE') return tooLarge(maxBytes);
  if (code === 'LIMIT_UNEXPECTED_FILE' || code === 'LIMIT_FILE_COUNT') return invalid('file', 'Send exactly one file, in the form field "file".');
  return new AppError('validation', 'The upload could not be read.', [{ path: 'file', message: 'Send the CSV as multipart/form-data in the field "file".' }]);
}

/**
 * Accepts one CSV file in the multipart field "file", held in memory up to `maxBytes`. A declared
 * body larger than that is refused with 413 before a byte of it is read; an undeclared (chunked)
 * one is cut off by multer at the same limit. CSV has no magic number: the content is checked by
 * parsing it (csv-reader.ts), the name only has to end in .csv or .txt.
 */
export function CsvUpload(maxBytes: number): Type<NestInterceptor> {
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: maxBytes, files: 1, fields: 0, parts: 1 } }).single('file');

  @Injectable()
  class CsvUploadInterceptor implements NestInterceptor {
    async intercept(context: ExecutionContext, next: CallHandler): Promise<Observable<unknown>> {
      const http = context.switchToHttp();
      const req = http.getRequest<Request>();
      const res = http.getResponse<Response>();
      const declared = Number(req.headers['content-length'] ?? 0);
      if (declared > maxBytes + MULTIPART_SLACK_BYTES) {
        // The rest of the body is never read, so the connection cannot be reused for another request.
        res.setHeader('Connection', 'close');
        throw tooLarge(maxBytes);
      }
      await new Promise<void>((resolve, reject) => upload(req, res, (err: unknown) => (err ? reject(multerFailure(err, maxBytes)) : resolve())));
      const file = req.file;
      if (!file) throw invalid('file', 'Attach the CSV file in the form field "file".');
      if (!/\.(csv|txt)$/i.test(file.originalname)) throw invalid('file', 'Upload a .csv file.');
      return next.handle();
    }
  }
  return mixin(CsvUploadInterceptor);
}
