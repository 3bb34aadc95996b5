import { Controller, Get, Inject, Res } from '@nestjs/common';
import type { Response } from 'express';
import { sql } from 'drizzle-orm';
import { Public } from '../../common/auth/decorators.js';
import { DB, type DbHandle } from '../../core/database.js';

@Controller('health')
export class HealthController {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  @Public()
  @Get()
  async check(@Res({ passthrough: true }) res: Response): Promise<{ status: 'ok' | 'degraded'; db: 'ok' | 'down' }> {
    try {
      await this.dbh.db.execute(sql`select 1`);
      return { status: 'ok', db: 'ok' };
    } catch {
      res.status(503);
      return { status: 'degraded', db: 'down' };
    }
  }
}
