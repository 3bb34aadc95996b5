import { Button, Stack, Text } from '@mantine/core';
import { IconCreditCard } from '@tabler/icons-react';
import { formatMoney } from '@hitchbook/shared/money';
import type { InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { useOpenCheckout } from '../api/openCheckout';

/** Opens the card checkout for the balance the server holds; the label shows that figure as the server sent it. */
export function PayButton({ invoice, label }: { invoice: InvoiceDto; label?: string }) {
  const checkout = useOpenCheckout(invoice.id);
  return (
    <Stack gap={6}>
      <Button
        size="lg"
        leftSection={<IconCreditCard size={22} />}
        loading={checkout.isPending || checkout.isSuccess}
        onClick={() => checkout.mutate(undefined, { onSuccess: ({ url }) => window.location.assign(url) })}
      >
        {label ?? `Pay ${formatMoney(invoice.balance)} by card`}
      </Button>
      {checkout.isError && (
        <Text c="red.8" size="sm" role="alert">
          {checkout.error.message}
        </Text>
      )}
    </Stack>
  );
}
