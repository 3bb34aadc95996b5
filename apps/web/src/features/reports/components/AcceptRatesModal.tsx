import { useState } from 'react';
import { Alert, Anchor, Button, Checkbox, Group, Modal, Stack, Table, Text } from '@mantine/core';
import { useMediaQuery } from '@mantine/hooks';
import { Link } from 'react-router-dom';
import type { AcceptedRatesDto, MachineRateRowDto } from '@hitchbook/shared/schemas/reports';
import { formatRate } from '../../../lib/money';
import { paths } from '../../../lib/paths';
import { useAcceptSuggestedRates } from '../api/acceptSuggestedRates';
import { acceptableMachines } from '../yearEnd';

function Accepted({ result, onClose }: { result: AcceptedRatesDto; onClose: () => void }) {
  return (
    <Stack gap="md" data-testid="accepted-rates">
      <Alert color="harbor" variant="light" title={`${result.name} is ready`}>
        It starts on {result.effectiveFrom} with {result.machineRates.length} machine-hour{' '}
        {result.machineRates.length === 1 ? 'rate' : 'rates'}; its other rates and terms are copied from the sheet in force.
      </Alert>
      <Group justify="flex-end">
        <Anchor component={Link} to={paths.rateSheet(result.rateSheetId)}>
          Open the new rate sheet
        </Anchor>
        <Button onClick={onClose}>Done</Button>
      </Group>
    </Stack>
  );
}

function Picker({ rows, year, onClose }: { rows: MachineRateRowDto[]; year: number; onClose: () => void }) {
  const candidates = acceptableMachines(rows);
  const [picked, setPicked] = useState<string[]>(() => candidates.map((r) => r.machineId));
  const accept = useAcceptSuggestedRates();
  if (accept.data) return <Accepted result={accept.data} onClose={onClose} />;
  const toggle = (id: string, on: boolean) => setPicked((current) => (on ? [...current, id] : current.filter((x) => x !== id)));
  return (
    <Stack gap="md">
      <Text>
        A new family rate sheet starting 1 January {year + 1} gets the suggested machine-hour rates of the machines you pick;
        the rates of the others, and every other rate and term, are copied from the sheet in force now.
      </Text>
      {/* Narrow enough that both rates stay in view on a phone. */}
      <Table.ScrollContainer minWidth={330}>
        <Table verticalSpacing={6} horizontalSpacing="xs">
          <Table.Thead>
            <Table.Tr>
              <Table.Th>
                <Checkbox
                  aria-label="All machines"
                  checked={picked.length === candidates.length}
                  indeterminate={picked.length > 0 && picked.length < candidates.length}
                  onChange={(e) => setPicked(e.currentTarget.checked ? candidates.map((r) => r.machineId) : [])}
                />
              </Table.Th>
              <Table.Th>Machine</Table.Th>
              <Table.Th ta="right">Now</Table.Th>
              <Table.Th ta="right">Suggested</Table.Th>
            </Table.Tr>
          </Table.Thead>
          <Table.Tbody>
            {candidates.map((r) => (
              <Table.Tr key={r.machineId}>
                <Table.Td>
                  <Checkbox aria-label={r.name} checked={picked.includes(r.machineId)} onChange={(e) => toggle(r.machineId, e.currentTarget.checked)} />
                </Table.Td>
                <Table.Td>{r.name}</Table.Td>
                <Table.Td ta="right">{r.currentRate ? formatRate(r.currentRate.perHour, 'h') : '—'}</Table.Td>
                <Table.Td ta="right" fw={700}>
                  {r.suggestedRate && formatRate(r.suggestedRate.perHour, 'h')}
                </Table.Td>
              </Table.Tr>
            ))}
          </Table.Tbody>
        </Table>
      </Table.ScrollContainer>
      {accept.isError && (
        <Alert color="red" role="alert">
          {accept.error.message}
        </Alert>
      )}
      <Group justify="flex-end">
        <Button variant="default" onClick={onClose}>
          Cancel
        </Button>
        <Button disabled={picked.length === 0} loading={accept.isPending} onClick={() => accept.mutate({ year, machineIds: picked })}>
          Create the rate sheet with {picked.length} {picked.length === 1 ? 'rate' : 'rates'}
        </Button>
      </Group>
    </Stack>
  );
}

export function AcceptRatesModal({ rows, year, opened, onClose }: { rows: MachineRateRowDto[]; year: number; opened: boolean; onClose: () => void }) {
  const phone = useMediaQuery('(max-width: 48em)');
  return (
    <Modal opened={opened} onClose={onClose} title={`Suggested rates for ${year + 1}`} size="lg" fullScreen={phone}>
      {opened && <Picker rows={rows} year={year} onClose={onClose} />}
    </Modal>
  );
}
