import { useEffect, useState, type ReactNode } from 'react';
import { Button, Group, Loader, Paper, Skeleton, Stack, Text, ThemeIcon, Title } from '@mantine/core';
import { IconCircleCheck, IconClockHour4, IconCreditCardOff } from '@tabler/icons-react';
import { Link, Navigate, useParams, useSearchParams } from 'react-router-dom';
import { formatMoney } from '@hitchbook/shared/money';
import type { InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { NotFound } from '../../../components/NotFound';
import { QueryError } from '../../../components/QueryError';
import { isApiError } from '../../../lib/api';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { paths } from '../../../lib/paths';
import { useMyInvoice } from '../api/getMyInvoice';
import { useMyPayments } from '../api/listMyPayments';
import { PayButton } from '../components/PayButton';
import { paymentReturnStatus, type ReturnStatus } from '../paymentReturn';

const POLL_MS = 1500;

function useWaited(running: boolean): number {
  const [startedAt] = useState(() => Date.now());
  const [now, setNow] = useState(startedAt);
  useEffect(() => {
    if (!running) return undefined;
    const timer = setInterval(() => setNow(Date.now()), 1000);
    return () => clearInterval(timer);
  }, [running]);
  return now - startedAt;
}

function Outcome({ icon, color, title, children }: { icon: ReactNode; color: string; title: string; children: ReactNode }) {
  return (
    <Paper withBorder p="xl" maw={560} mx="auto" mt="lg" data-testid="payment-outcome">
      <Stack align="center" ta="center" gap="md">
        <ThemeIcon size={72} radius="xl" variant="light" color={color}>
          {icon}
        </ThemeIcon>
        <Title order={1} size="h2">
          {title}
        </Title>
        {children}
      </Stack>
    </Paper>
  );
}

function PaidOutcome({ invoice }: { invoice: InvoiceDto }) {
  const payments = useMyPayments(invoice.id);
  const card = payments.data?.filter((p) => p.method === 'card' && p.status === 'succeeded').at(-1);
  return (
    <Outcome icon={<IconCircleCheck size={44} />} color="harbor" title="Paid — thank you">
      <Text>
        {card ? `${formatMoney(card.amount)} paid by card on invoice ${invoice.numberLabel}.` : `Invoice ${invoice.numberLabel} is paid.`} A receipt is on
        its way by e-mail.
      </Text>
      <Text fw={700} data-testid="invoice-balance">
        Still to pay: {formatMoney(invoice.balance)}
      </Text>
      <Button component={Link} to={paths.myInvoice(invoice.id)}>
        See the invoice
      </Button>
    </Outcome>
  );
}

function ReturnOutcome({ status, invoice }: { status: ReturnStatus; invoice: InvoiceDto }) {
  switch (status) {
    case 'paid':
      return <PaidOutcome invoice={invoice} />;
    case 'confirming':
      return (
        <Outcome icon={<Loader color="harbor" />} color="harbor" title="Payment being confirmed">
          <Text>Your card was accepted. Hitchbook is waiting for the card processor to confirm it; this takes a few seconds.</Text>
        </Outcome>
      );
    case 'slow':
      return (
        <Outcome icon={<IconClockHour4 size={44} />} color="clay" title="Still being confirmed">
          <Text>
            The confirmation is taking longer than usual. You do not need to pay again: the invoice shows the payment as
            soon as it arrives, and a receipt follows by e-mail.
          </Text>
          <Button component={Link} to={paths.myInvoice(invoice.id)} variant="default">
            See the invoice
          </Button>
        </Outcome>
      );
    case 'cancelled':
      return (
        <Outcome icon={<IconCreditCardOff size={44} />} color="clay" title="No payment was made">
          <Text>
            The card checkout was closed before a payment went through, or the card was declined. Nothing was charged;{' '}
            {formatMoney(invoice.balance)} is still open on invoice {invoice.numberLabel}.
          </Text>
          <Group justify="center">
            <PayButton invoice={invoice} label="Try again" />
            <Button component={Link} to={paths.myInvoice(invoice.id)} variant="default" size="lg">
              Back to the invoice
            </Button>
          </Group>
        </Outcome>
      );
  }
}

function CheckoutReturn({ invoiceId, checkout }: { invoiceId: string; checkout: string }) {
  const [polling, setPolling] = useState(checkout === 'success');
  const waited = useWaited(polling);
  const invoice = useMyInvoice(invoiceId, polling ? POLL_MS : false);
  const status = invoice.data ? paymentReturnStatus({ checkout, balance: invoice.data.balance, waitedMs: waited }) : null;

  useEffect(() => {
    if (status && status !== 'confirming') setPolling(false);
  }, [status]);

  if (invoice.isError && isApiError(invoice.error) && (invoice.error.status === 404 || invoice.error.status === 400)) return <NotFound />;
  if (invoice.isError) return <QueryError error={invoice.error} onRetry={() => void invoice.refetch()} />;
  if (!invoice.data || !status) return <Skeleton h={320} maw={560} mx="auto" mt="lg" />;
  return <ReturnOutcome status={status} invoice={invoice.data} />;
}

/**
 * The e-mail's pay link opens the invoice for whoever signs in: the customer's own page, or the
 * staff page for the outfit. Only a return from the card checkout stays here, to confirm it.
 */
export function Component() {
  const user = useSessionUserOrThrow();
  const { invoiceId = '' } = useParams();
  const [searchParams] = useSearchParams();
  const checkout = searchParams.get('checkout');
  if (user.role !== 'customer') return <Navigate to={paths.invoice(invoiceId)} replace />;
  if (checkout === null) return <Navigate to={paths.myInvoice(invoiceId)} replace />;
  return <CheckoutReturn invoiceId={invoiceId} checkout={checkout} />;
}
