import { Inject, Injectable } from '@nestjs/common';
import type { AcceptedRatesDto, AcceptSuggestedRates } from '@hitchbook/shared/schemas/reports';
import type { Actor } from '../../common/auth/actor.js';
import { AppError, conflict, type FieldIssue } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { DB, type DbHandle } from '../../core/database.js';
import { MachineRatesService } from './machine-rates.service.js';
import { MachineYearRepository } from './machine-year.repository.js';
import { SuggestedRatesRepository } from './suggested-rates.repository.js';

/** Accepting the year-end suggestions: the server recomputes them, the caller only picks the machines. */
@Injectable()
export class SuggestedRatesService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(MachineRatesService) private readonly rates: MachineRatesService,
    @Inject(MachineYearRepository) private readonly year: MachineYearRepository,
    @Inject(SuggestedRatesRepository) private readonly repo: SuggestedRatesRepository,
    @Inject(AuditService) private readonly audit: AuditService,
  ) {}

  async accept(actor: Actor, input: AcceptSuggestedRates): Promise<AcceptedRatesDto> {
    const effectiveFrom = `${input.year + 1}-01-01`;
    return this.dbh.db.transaction(async (tx) => {
      await this.repo.lockOperation(actor.operationId, tx);
      const report = await this.rates.report(actor.operationId, input, tx);
      const issues: FieldIssue[] = [];
      const picked = input.machineIds.map((machineId, index) => {
        const row = report.machines.find((m) => m.machineId === machineId);
        if (!row) issues.push({ path: `machineIds.${index}`, message: 'No such machine in the year’s report.' });
        else if (!row.suggestedRate) issues.push({ path: `machineIds.${index}`, message: `${row.name} has no suggested rate: it needs logged hours and costs or an estimate.` });
        return { machineId, name: row?.name ?? '', ratePerHour: row?.suggestedRate?.perHour ?? '' };
      });

      let baseId: string | null = null;
      if (input.rateSheetId) {
        const base = await this.repo.sheet(actor.operationId, input.rateSheetId, tx);
        if (!base) issues.push({ path: 'rateSheetId', message: 'No such rate sheet.' });
        else if (base.relationship !== 'family' || base.partyId !== null) issues.push({ path: 'rateSheetId', message: 'Pick a family rate sheet that is not a party override.' });
        else baseId = base.id;
      } else {
        baseId = (await this.year.familySheetOn(actor.operationId, `${input.year}-12-31`, tx))?.id ?? null;
      }
      if (issues.length > 0) throw new AppError('validation', 'Some fields need attention.', issues);
      if (await this.repo.familySheetStartingOn(actor.operationId, effectiveFrom, tx)) {
        throw conflict(`A family rate sheet already starts on ${effectiveFrom}; change its machine rates there instead.`);
      }

      const name = `Family rates ${input.year + 1}`;
      const sheetId = await this.repo.createSheet(actor.operationId, name, effectiveFrom, baseId, tx);
      await this.repo.setMachineRates(actor.operationId, sheetId, baseId, picked, tx);
      const result: AcceptedRatesDto = { rateSheetId: sheetId, name, effectiveFrom, copiedFromRateSheetId: baseId, machineRates: picked };
      await this.audit.record(this.audit.byActor(actor, 'machine-rates.accepted', 'rate-sheet', sheetId, { after: { year: input.year, ...result } }), tx);
      return result;
    });
  }
}
