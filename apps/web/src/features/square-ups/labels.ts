import type { SquareUpStatus, TransferMethod } from '@hitchbook/shared/schemas/square-ups';

export const STATUS_LABELS: Record<SquareUpStatus, string> = { open: 'Open', closed: 'Closed' };
export const STATUS_COLORS: Record<SquareUpStatus, string> = { open: 'clay', closed: 'harbor' };

export const METHOD_LABELS: Record<TransferMethod, string> = { cheque: 'Cheque', cash: 'Cash', transfer: 'Bank transfer' };

export const COST_KIND_LABELS = { fixed: 'Fixed', operating: 'Operating' } as const;
