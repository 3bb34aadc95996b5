import type { ReactNode } from 'react';
import { Group, Paper, Stack, Table, Text } from '@mantine/core';
import { useMediaQuery } from '@mantine/hooks';
import type { InvoiceLineDto } from '@hitchbook/shared/schemas/invoices';
import { lineView, type LineView } from '../lineDisplay';

interface InvoiceLinesTableProps {
  lines: InvoiceLineDto[];
  /** A control beside a line, such as removing a line the owner added to a draft. */
  lineAction?: (line: InvoiceLineDto) => ReactNode;
}

function WhatCell({ view }: { view: LineView }) {
  return (
    <Stack gap={0}>
      <Text fw={view.isWork ? 600 : 500} fs={view.isWork ? undefined : 'italic'} size="sm">
        {view.what}
      </Text>
      {view.detail && (
        <Text size="xs" c="dimmed">
          {view.detail}
        </Text>
      )}
    </Stack>
  );
}

function PhoneLines({ lines, lineAction }: InvoiceLinesTableProps) {
  return (
    <Stack gap={0}>
      {lines.map((line) => {
        const view = lineView(line);
        return (
          <Group key={line.id} justify="space-between" align="flex-start" wrap="nowrap" py="sm" style={{ borderBottom: '1px solid var(--mantine-color-slate-2)' }}>
            <Stack gap={2} miw={0}>
              <WhatCell view={view} />
              <Text size="xs" c="dimmed">
                {[view.date, view.field].filter(Boolean).join(' · ')}
              </Text>
              {view.quantity && (
                <Text size="xs" c="dimmed">
                  {view.quantity} {view.unit}
                  {view.rate ? ` × ${view.rate}` : ''}
                </Text>
              )}
            </Stack>
            <Group gap={4} wrap="nowrap">
              <Text fw={700} style={{ whiteSpace: 'nowrap' }}>
                {view.amount}
              </Text>
              {lineAction?.(line)}
            </Group>
          </Group>
        );
      })}
    </Stack>
  );
}

/** The invoice's lines as priced by the server: work entries first by day, with their extra charges. */
export function InvoiceLinesTable({ lines, lineAction }: InvoiceLinesTableProps) {
  const phone = useMediaQuery('(max-width: 48em)');
  return (
    <Paper withBorder p={phone ? 'sm' : 0} data-testid="invoice-lines">
      {phone ? (
        <PhoneLines lines={lines} lineAction={lineAction} />
      ) : (
        <Table verticalSpacing="sm" horizontalSpacing="md" striped>
          <Table.Thead>
            <Table.Tr>
              <Table.Th>Date</Table.Th>
              <Table.Th>Field</Table.Th>
              <Table.Th>Work</Table.Th>
              <Table.Th ta="right">Quantity</Table.Th>
              <Table.Th>Unit</Table.Th>
              <Table.Th ta="right">Rate</Table.Th>
              <Table.Th ta="right">Amount</Table.Th>
              {lineAction && <Table.Th aria-label="Line actions" w={48} />}
            </Table.Tr>
          </Table.Thead>
          <Table.Tbody>
            {lines.map((line) => {
              const view = lineView(line);
              return (
                <Table.Tr key={line.id}>
                  <Table.Td style={{ whiteSpace: 'nowrap' }}>{view.date ?? ''}</Table.Td>
                  <Table.Td>{view.field ?? ''}</Table.Td>
                  <Table.Td>
                    <WhatCell view={view} />
                  </Table.Td>
                  <Table.Td ta="right">{view.quantity ?? ''}</Table.Td>
                  <Table.Td>{view.unit ?? ''}</Table.Td>
                  <Table.Td ta="right">{view.rate ?? ''}</Table.Td>
                  <Table.Td ta="right" fw={700} style={{ whiteSpace: 'nowrap' }}>
                    {view.amount}
                  </Table.Td>
                  {lineAction && <Table.Td>{lineAction(line)}</Table.Td>}
                </Table.Tr>
              );
            })}
          </Table.Tbody>
        </Table>
      )}
    </Paper>
  );
}
