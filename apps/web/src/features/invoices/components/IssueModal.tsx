import { Alert, Button, Group, List, Stack, Text } from '@mantine/core';
import { IconAlertTriangle } from '@tabler/icons-react';
import dayjs from 'dayjs';
import { formatMoney } from '@hitchbook/shared/money';
import type { InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useIssueInvoice } from '../api/issueInvoice';
import { formatDay } from '../labels';
import { ActionModal } from './ActionModal';

interface IssueModalProps {
  invoice: InvoiceDto;
  opened: boolean;
  onClose: () => void;
  onIssued: (invoice: InvoiceDto) => void;
}

export function IssueModal({ invoice, opened, onClose, onIssued }: IssueModalProps) {
  const issue = useIssueInvoice(invoice.id);
  return (
    <ActionModal opened={opened} onClose={onClose} title="Issue this invoice?">
      <Stack gap="md">
        <Text>
          {invoice.partyName} will owe <b>{formatMoney(invoice.total)}</b>, due {formatDay(dayjs().add(invoice.termsDays, 'day').format('YYYY-MM-DD'))}.
        </Text>
        <Alert color="clay" icon={<IconAlertTriangle />} title="The numbers are final">
          <List size="sm" spacing={4}>
            <List.Item>The invoice takes the next number, and its lines and rates are frozen.</List.Item>
            <List.Item>It cannot be edited afterwards: a mistake is corrected by voiding it or with a credit note.</List.Item>
            <List.Item>Its work entries, held by the draft since it was made, stay on this invoice and cannot be billed again.</List.Item>
          </List>
        </Alert>
        <FormErrorAlert message={issue.error?.message ?? null} />
        <Group justify="flex-end">
          <Button variant="default" onClick={onClose}>
            Not yet
          </Button>
          <Button
            loading={issue.isPending}
            // A fresh key for every click: a network retry of this click is answered with the same invoice.
            onClick={() => issue.mutate({ version: invoice.version, idempotencyKey: crypto.randomUUID() }, { onSuccess: onIssued })}
          >
            Issue invoice
          </Button>
        </Group>
      </Stack>
    </ActionModal>
  );
}
