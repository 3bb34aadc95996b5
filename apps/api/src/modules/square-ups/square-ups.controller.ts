import { Body, Controller, Get, HttpCode, Inject, Param, Post, Query, type StreamableFile } from '@nestjs/common';
import type { Page } from '@hitchbook/shared/schemas/common';
import {
  squareUpCreateSchema,
  squareUpListQuerySchema,
  statementLinesQuerySchema,
  transferPaidSchema,
  type SquareUpCreate,
  type SquareUpDto,
  type SquareUpListQuery,
  type SquareUpStatementDto,
  type SquareUpSummaryDto,
  type StatementLinesDto,
  type StatementLinesQuery,
  type TransferDto,
  type TransferPaid,
} from '@hitchbook/shared/schemas/square-ups';
import type { Actor } from '../../common/auth/actor.js';
import { CurrentActor, Roles } from '../../common/auth/decorators.js';
import { UuidPipe } from '../../common/validation/uuid.pipe.js';
import { ZodPipe } from '../../common/validation/zod.pipe.js';
import { SquareUpsService } from './square-ups.service.js';
import { KeptUntilDataChanges } from '../../common/http/read-cache.js';

const READERS = ['owner', 'partner', 'bookkeeper'] as const;
const WRITERS = ['owner', 'partner'] as const;

/** The family's square-ups: owner and partner run them, the bookkeeper reads and exports them. */
@Controller('square-ups')
export class SquareUpsController {
  constructor(@Inject(SquareUpsService) private readonly squareUps: SquareUpsService) {}

  @Roles(...READERS)
  @Get()
  list(@CurrentActor() actor: Actor, @Query(new ZodPipe(squareUpListQuerySchema)) query: SquareUpListQuery): Promise<Page<SquareUpSummaryDto>> {
    return this.squareUps.list(actor, query);
  }

  @Roles(...WRITERS)
  @Post()
  create(@CurrentActor() actor: Actor, @Body(new ZodPipe(squareUpCreateSchema)) body: SquareUpCreate): Promise<SquareUpDto> {
    return this.squareUps.create(actor, body);
  }

  @Roles(...READERS)
  @Get(':id')
  get(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string): Promise<SquareUpDto> {
    return this.squareUps.get(actor, id);
  }

  @Roles(...READERS)
  @KeptUntilDataChanges()
  @Get(':id/statement')
  statement(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string): Promise<SquareUpStatementDto> {
    return this.squareUps.statement(actor, id);
  }

  @Roles(...READERS)
  @Get(':id/statement/lines')
  lines(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Query(new ZodPipe(statementLinesQuerySchema)) query: StatementLinesQuery): Promise<StatementLinesDto> {
    return this.squareUps.lines(actor, id, query);
  }

  @Roles(...READERS)
  @Get(':id/statement.csv')
  statementCsv(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string): Promise<StreamableFile> {
    return this.squareUps.statementCsv(actor, id);
  }

  @Roles(...READERS)
  @Get(':id/statement.pdf')
  statementPdf(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string): Promise<StreamableFile> {
    return this.squareUps.statementPdf(actor, id);
  }

  @Roles(...WRITERS)
  @Post(':id/close')
  @HttpCode(200)
  close(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string): Promise<SquareUpStatementDto> {
    return this.squareUps.close(actor, id);
  }

  @Roles(...WRITERS)
  @Post(':id/transfers/:transferId/paid')
  @HttpCode(200)
  markPaid(
    @CurrentActor() actor: Actor,
    @Param('id', new UuidPipe()) id: string,
    @Param('transferId', new UuidPipe()) transferId: string,
    @Body(new ZodPipe(transferPaidSchema)) body: TransferPaid,
  ): Promise<TransferDto> {
    return this.squareUps.markTransferPaid(actor, id, transferId, body);
  }
}
