import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { TransferDto, TransferPaid } from '@hitchbook/shared/schemas/square-ups';
import { api } from '../../../lib/api';

export function recordTransferPaid(squareUpId: string, transferId: string, input: TransferPaid) {
  return api.post<TransferDto>(
    `/api/square-ups/${encodeURIComponent(squareUpId)}/transfers/${encodeURIComponent(transferId)}/paid`,
    input,
  );
}

export function useRecordTransferPaid(squareUpId: string, transferId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: TransferPaid) => recordTransferPaid(squareUpId, transferId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['square-ups'] }),
  });
}
