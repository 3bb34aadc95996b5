import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MeterReadingCreateInput, MeterReadingDto } from '@hitchbook/shared/schemas/machines';
import { api } from '../../../lib/api';

export function createMeterReading(machineId: string, input: MeterReadingCreateInput) {
  return api.post<MeterReadingDto>(`/api/machines/${encodeURIComponent(machineId)}/meter-readings`, input);
}

export function useCreateMeterReading(machineId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: MeterReadingCreateInput) => createMeterReading(machineId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['machines'] }),
  });
}
