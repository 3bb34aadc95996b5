import { useState } from 'react';
import { Button, Group, Menu, Paper, Skeleton, Stack, Text, Title } from '@mantine/core';
import { notifications } from '@mantine/notifications';
import { IconBan, IconCash, IconChevronDown, IconDiscount, IconDownload, IconMail, IconNote, IconPlus, IconReceiptRefund, IconTrash } from '@tabler/icons-react';
import { useNavigate, useParams } from 'react-router-dom';
import type { Role } from '@hitchbook/shared/roles';
import type { InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { NotFound } from '../../../components/NotFound';
import { PageHeader } from '../../../components/PageHeader';
import { QueryError } from '../../../components/QueryError';
import { isApiError } from '../../../lib/api';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { paths } from '../../../lib/paths';
import { useDownloadInvoicePdf } from '../api/downloadInvoicePdf';
import { useInvoice } from '../api/getInvoice';
import { AddLineModal } from '../components/AddLineModal';
import { CreditNoteModal } from '../components/CreditNoteModal';
import { DeleteDraftModal } from '../components/DeleteDraftModal';
import { DiscountModal } from '../components/DiscountModal';
import { InvoiceLinesTable } from '../components/InvoiceLinesTable';
import { InvoiceNotices } from '../components/InvoiceNotices';
import { InvoiceStateBadge } from '../components/InvoiceStateBadge';
import { InvoiceTotals } from '../components/InvoiceTotals';
import { IssueModal } from '../components/IssueModal';
import { NoteModal } from '../components/NoteModal';
import { PartyAndTerms } from '../components/PartyAndTerms';
import { PaymentsPanel } from '../components/PaymentsPanel';
import { RecordPaymentModal } from '../components/RecordPaymentModal';
import { RemoveLineButton } from '../components/RemoveLineButton';
import { SendModal } from '../components/SendModal';
import { VoidModal } from '../components/VoidModal';
import { invoiceActionsFor } from '../invoiceActions';

type Dialog = 'addLine' | 'discount' | 'note' | 'issue' | 'delete' | 'payment' | 'send' | 'void' | 'credit';

function titleOf(invoice: InvoiceDto): string {
  if (invoice.status === 'draft') return `Draft invoice for ${invoice.partyName}`;
  return invoice.kind === 'credit-note' ? `Credit note ${invoice.numberLabel}` : `Invoice ${invoice.numberLabel}`;
}

function InvoiceView({ invoice, role }: { invoice: InvoiceDto; role: Role }) {
  const navigate = useNavigate();
  const actions = invoiceActionsFor(role, invoice);
  const pdf = useDownloadInvoicePdf();
  const [dialog, setDialog] = useState<Dialog | null>(null);
  const close = () => setDialog(null);
  const openDialog = (d: Dialog) => () => setDialog(d);
  // A credit note's note is its reason, which the notice above already gives.
  const showNote = Boolean(invoice.notes) && !invoice.creditOf;

  const downloadPdf = () =>
    pdf.mutate(invoice, { onError: (error) => notifications.show({ color: 'red', title: 'The PDF could not be downloaded', message: error.message }) });

  const headerActions = (
    <>
      {actions.issue && (
        <Button onClick={openDialog('issue')} data-testid="issue-invoice">
          Issue invoice
        </Button>
      )}
      {actions.recordPayment && (
        <Button leftSection={<IconCash size={18} />} onClick={openDialog('payment')}>
          Record payment
        </Button>
      )}
      {actions.send && (
        <Button variant="default" leftSection={<IconMail size={18} />} onClick={openDialog('send')}>
          Send by e-mail
        </Button>
      )}
      <Button variant="default" leftSection={<IconDownload size={18} />} loading={pdf.isPending} onClick={downloadPdf}>
        Download PDF
      </Button>
      {(actions.creditNote || actions.void) && (
        <Menu position="bottom-end">
          <Menu.Target>
            <Button variant="default" rightSection={<IconChevronDown size={16} />}>
              Correct
            </Button>
          </Menu.Target>
          <Menu.Dropdown>
            {actions.creditNote && (
              <Menu.Item leftSection={<IconReceiptRefund size={18} />} onClick={openDialog('credit')}>
                Credit note…
              </Menu.Item>
            )}
            {actions.void && (
              <Menu.Item color="red" leftSection={<IconBan size={18} />} onClick={openDialog('void')}>
                {invoice.kind === 'credit-note' ? 'Void credit note…' : 'Void invoice…'}
              </Menu.Item>
            )}
          </Menu.Dropdown>
        </Menu>
      )}
      {actions.deleteDraft && (
        <Button variant="subtle" color="red" leftSection={<IconTrash size={18} />} onClick={openDialog('delete')}>
          Delete draft
        </Button>
      )}
    </>
  );

  return (
    <Stack gap="lg">
      <PageHeader
        title={titleOf(invoice)}
        description={
          <Group gap="xs" component="span">
            <InvoiceStateBadge state={invoice.state} />
            {invoice.status !== 'draft' && <span>{invoice.partyName}</span>}
          </Group>
        }
        actions={headerActions}
      />
      <InvoiceNotices invoice={invoice} />
      <PartyAndTerms invoice={invoice} />
      <Stack gap="sm">
        <Group justify="space-between" gap="sm">
          <Title order={2} size="h4">
            {invoice.entryCount > 0 ? `Lines for ${invoice.entryCount} work ${invoice.entryCount === 1 ? 'entry' : 'entries'}` : 'Lines'}
          </Title>
          {actions.editDraft && (
            <Group gap="xs">
              <Button size="sm" variant="light" leftSection={<IconPlus size={16} />} onClick={openDialog('addLine')}>
                Add a line
              </Button>
              <Button size="sm" variant="light" leftSection={<IconDiscount size={16} />} onClick={openDialog('discount')}>
                Discount
              </Button>
              <Button size="sm" variant="light" leftSection={<IconNote size={16} />} onClick={openDialog('note')}>
                Note and terms
              </Button>
            </Group>
          )}
        </Group>
        <InvoiceLinesTable
          // The discount is shown once, with the totals it comes off.
          lines={invoice.lines.filter((line) => line.kind !== 'discount')}
          lineAction={actions.editDraft ? (line) => (line.kind === 'adjustment' ? <RemoveLineButton invoice={invoice} line={line} /> : null) : undefined}
        />
      </Stack>
      <Group justify={showNote ? 'space-between' : 'flex-end'} align="flex-start" gap="lg">
        {showNote && (
          <Paper withBorder p="md" style={{ flex: '1 1 280px' }} maw={560}>
            <Text size="sm" c="dimmed" mb={4}>
              Note
            </Text>
            <Text style={{ whiteSpace: 'pre-wrap' }}>{invoice.notes}</Text>
          </Paper>
        )}
        <InvoiceTotals invoice={invoice} />
      </Group>
      {actions.issue && (
        <Group justify="flex-end">
          <Button size="lg" onClick={openDialog('issue')}>
            Issue invoice
          </Button>
        </Group>
      )}
      {invoice.status !== 'draft' && invoice.kind === 'invoice' && <PaymentsPanel invoiceId={invoice.id} canRefund={actions.refund} />}

      <AddLineModal invoice={invoice} opened={dialog === 'addLine'} onClose={close} />
      <DiscountModal invoice={invoice} opened={dialog === 'discount'} onClose={close} />
      <NoteModal invoice={invoice} opened={dialog === 'note'} onClose={close} />
      <IssueModal
        invoice={invoice}
        opened={dialog === 'issue'}
        onClose={close}
        onIssued={(issued) => {
          close();
          notifications.show({ color: 'harbor', title: `${issued.numberLabel} issued`, message: 'Send it by e-mail so the customer can pay by card.' });
        }}
      />
      <DeleteDraftModal invoice={invoice} opened={dialog === 'delete'} onClose={close} onDeleted={() => navigate(paths.invoices(), { replace: true })} />
      <RecordPaymentModal invoice={invoice} opened={dialog === 'payment'} onClose={close} />
      <SendModal invoice={invoice} opened={dialog === 'send'} onClose={close} />
      <VoidModal invoice={invoice} opened={dialog === 'void'} onClose={close} />
      <CreditNoteModal
        invoice={invoice}
        opened={dialog === 'credit'}
        onClose={close}
        onIssued={(note) => {
          close();
          navigate(paths.invoice(note.id));
        }}
      />
    </Stack>
  );
}

export function Component() {
  const { invoiceId = '' } = useParams();
  const user = useSessionUserOrThrow();
  const invoice = useInvoice(invoiceId);
  if (invoice.isError && isApiError(invoice.error) && (invoice.error.status === 404 || invoice.error.status === 400)) return <NotFound />;
  if (invoice.isError) return <QueryError error={invoice.error} onRetry={() => void invoice.refetch()} />;
  if (invoice.isPending) return <Skeleton h={480} />;
  return <InvoiceView key={invoice.data.id} invoice={invoice.data} role={user.role} />;
}
