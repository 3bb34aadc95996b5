import { useState } from 'react';
import { Alert, Button, Group, Paper, Stack, Text } from '@mantine/core';
import { IconCheck } from '@tabler/icons-react';
import { formatMoney } from '@hitchbook/shared/money';
import type { StatementTransferDto } from '@hitchbook/shared/schemas/square-ups';
import { METHOD_LABELS } from '../labels';
import { RecordPaidModal } from './RecordPaidModal';

type RecordedTransfer = StatementTransferDto & { id: string };

function isRecorded(t: StatementTransferDto): t is RecordedTransfer {
  return t.id !== null;
}

function PaidNote({ transfer }: { transfer: StatementTransferDto }) {
  if (!transfer.paidOn || !transfer.method) return null;
  return (
    <Group gap={6} wrap="nowrap" c="harbor.8" data-testid="transfer-paid">
      <IconCheck size={18} style={{ flexShrink: 0 }} />
      <Text size="sm" fw={700} c="harbor.8">
        Paid {transfer.paidOn}, {METHOD_LABELS[transfer.method]}
        {transfer.reference ? `, ${transfer.reference}` : ''}
      </Text>
    </Group>
  );
}

/** The fewest payments that settle every balance; recorded (and payable) once the period is closed. */
export function TransfersPanel({ squareUpId, transfers, closed, canManage }: { squareUpId: string; transfers: StatementTransferDto[]; closed: boolean; canManage: boolean }) {
  const [paying, setPaying] = useState<RecordedTransfer | null>(null);
  if (transfers.length === 0) {
    return (
      <Alert color="harbor" variant="light">
        Every household is square: no money needs to change hands.
      </Alert>
    );
  }
  return (
    <Stack gap="sm" data-testid="transfers">
      {!closed && (
        <Text size="sm" c="dimmed">
          These transfers settle the statement as it stands today. They are fixed, and can be recorded as paid, once the
          period is closed.
        </Text>
      )}
      {transfers.map((t) => (
        <Paper key={t.position} withBorder p="sm" radius="md" data-testid="transfer">
          <Group justify="space-between" gap="sm">
            <Text fz="lg">
              <b>{t.fromName}</b> pays <b>{t.toName}</b>{' '}
              <Text span fz="lg" fw={700} c="harbor.9">
                {formatMoney(t.amount)}
              </Text>
            </Text>
            {t.paidOn ? (
              <PaidNote transfer={t} />
            ) : (
              closed &&
              canManage &&
              isRecorded(t) && (
                <Button variant="light" onClick={() => setPaying(t)}>
                  Record as paid
                </Button>
              )
            )}
          </Group>
        </Paper>
      ))}
      {canManage && <RecordPaidModal squareUpId={squareUpId} transfer={paying} onClose={() => setPaying(null)} />}
    </Stack>
  );
}
