import { type DynamicModule, Inject, Module, type OnApplicationShutdown } from '@nestjs/common';
import { CoreModule } from './core/core.module.js';
import type { AppConfig } from './core/config.js';
import { DB, type DbHandle } from './core/database.js';
import { JobsModule } from './core/jobs.module.js';
import { AuthModule } from './modules/auth/auth.module.js';
import { DashboardModule } from './modules/dashboard/dashboard.module.js';
import { FieldsModule } from './modules/fields/fields.module.js';
import { MachinesModule } from './modules/machines/machines.module.js';
import { UploadsModule } from './modules/uploads/uploads.module.js';
import { WorkTypesModule } from './modules/work-types/work-types.module.js';
import { EstimatesModule } from './modules/estimates/estimates.module.js';
import { HealthModule } from './modules/health/health.module.js';
import { PartiesModule } from './modules/parties/parties.module.js';
import { UsersModule } from './modules/users/users.module.js';
import { PaymentsModule } from './modules/payments/payments.module.js';
import { WorkEntriesModule } from './modules/work-entries/work-entries.module.js';
import { InvoicesModule } from './modules/invoices/invoices.module.js';
import { RateSheetsModule } from './modules/rate-sheets/rate-sheets.module.js';
import { ReportsModule } from './modules/reports/reports.module.js';
import { SquareUpsModule } from './modules/square-ups/square-ups.module.js';
import { AuditModule } from './modules/audit/audit.module.js';

@Module({})
export class AppModule implements OnApplicationShutdown {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  static forRoot(config: AppConfig): DynamicModule {
    return {
      module: AppModule,
      imports: [CoreModule.forRoot(config), JobsModule, AuthModule, HealthModule, PartiesModule, UsersModule, DashboardModule, EstimatesModule, RateSheetsModule, UploadsModule, MachinesModule, FieldsModule, WorkTypesModule, WorkEntriesModule, ReportsModule, SquareUpsModule, InvoicesModule, PaymentsModule, AuditModule],
    };
  }

  async onApplicationShutdown(): Promise<void> {
    await this.dbh.close();
  }
}
