import type { ArgumentMetadata, PipeTransform } from '@nestjs/common';
import { AppError } from '../errors/app-error.js';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Path ids are UUIDs; anything else is a 400 naming the parameter, never a database error. */
export class UuidPipe implements PipeTransform<unknown, string> {
  transform(value: unknown, meta: ArgumentMetadata): string {
    if (typeof value !== 'string' || !UUID.test(value)) {
      const name = meta.data ?? 'id';
      throw new AppError('validation', 'Some fields need attention.', [{ path: name, message: 'Must be a valid id.' }]);
    }
    return value.toLowerCase();
  }
}
