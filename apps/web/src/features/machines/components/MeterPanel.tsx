import { lazy, Suspense, useState } from 'react';
import { Badge, Button, Group, Paper, Skeleton, Stack, Table, Text, Title } from '@mantine/core';
import { IconGauge } from '@tabler/icons-react';
import type { MeterReadingDto } from '@hitchbook/shared/schemas/machines';
import { TABULAR } from '../tabular';
import { formatDecimal } from '../../../lib/money';
import { READING_SOURCE_LABELS } from '../labels';
import { MeterReadingModal } from './MeterReadingModal';

const MeterChart = lazy(() => import('./MeterChart'));

const RECENT = 8;

const when = new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeStyle: 'short' });

interface MeterPanelProps {
  machineId: string;
  readings: readonly MeterReadingDto[];
  canRecord: boolean;
}

export function MeterPanel({ machineId, readings, canRecord }: MeterPanelProps) {
  const [recording, setRecording] = useState(false);
  const latestFirst = [...readings].sort((a, b) => Date.parse(b.readAt) - Date.parse(a.readAt));
  const latest = latestFirst[0];

  return (
    <Paper withBorder p="md" radius="md" data-testid="meter-panel">
      <Stack gap="md">
        <Group justify="space-between">
          <Stack gap={0}>
            <Title order={2} size="h4">
              Hour meter
            </Title>
            {latest && (
              <Text c="dimmed" size="sm">
                Last read {formatDecimal(latest.hours, 1)} h on {when.format(new Date(latest.readAt))}
              </Text>
            )}
          </Stack>
          {canRecord && (
            <Button variant="light" leftSection={<IconGauge size={18} />} onClick={() => setRecording(true)}>
              Add a reading
            </Button>
          )}
        </Group>
        {readings.length === 0 ? (
          <Text c="dimmed">No readings yet.</Text>
        ) : (
          <>
            <Suspense fallback={<Skeleton h={260} />}>
              <MeterChart readings={readings} />
            </Suspense>
            <Table.ScrollContainer minWidth={520}>
              <Table verticalSpacing="xs" data-testid="meter-readings">
                <Table.Thead>
                  <Table.Tr>
                    <Table.Th>Read</Table.Th>
                    <Table.Th ta="right">Meter</Table.Th>
                    <Table.Th ta="right">Machine total</Table.Th>
                    <Table.Th>From</Table.Th>
                  </Table.Tr>
                </Table.Thead>
                <Table.Tbody>
                  {latestFirst.slice(0, RECENT).map((r) => (
                    <Table.Tr key={r.id}>
                      <Table.Td>{when.format(new Date(r.readAt))}</Table.Td>
                      <Table.Td ta="right" style={TABULAR}>
                        {formatDecimal(r.hours, 1)} h
                      </Table.Td>
                      <Table.Td ta="right" style={TABULAR}>
                        {formatDecimal(r.totalHours, 1)} h
                      </Table.Td>
                      <Table.Td>
                        {r.kind === 'reset' ? (
                          <Badge color="clay" variant="light">
                            Meter replaced
                          </Badge>
                        ) : (
                          READING_SOURCE_LABELS[r.source]
                        )}
                      </Table.Td>
                    </Table.Tr>
                  ))}
                </Table.Tbody>
              </Table>
            </Table.ScrollContainer>
          </>
        )}
      </Stack>
      <MeterReadingModal opened={recording} machineId={machineId} onClose={() => setRecording(false)} />
    </Paper>
  );
}
