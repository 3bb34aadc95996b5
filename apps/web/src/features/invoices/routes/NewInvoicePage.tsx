import { Alert, Button, Group, Paper, Select, SimpleGrid, Stack, Text, TextInput, Textarea, Title } from '@mantine/core';
import { IconCalendarEvent } from '@tabler/icons-react';
import dayjs from 'dayjs';
import { useNavigate } from 'react-router-dom';
import { invoiceDraftCreateSchema, type InvoiceDraftCreateInput } from '@hitchbook/shared/schemas/invoices';
import { DecimalInput } from '../../../components/DecimalInput';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { NotAllowed } from '../../../components/NotAllowed';
import { PageHeader } from '../../../components/PageHeader';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { useServerForm } from '../../../lib/form';
import { paths } from '../../../lib/paths';
import { useCreateDraft } from '../api/createDraft';
import { useUnbilledSpan } from '../api/getUnbilledSpan';
import { useCustomerOptions } from '../api/listCustomerOptions';
import { canBill } from '../invoiceActions';
import { formatDay } from '../labels';

interface DraftValues {
  partyId: string;
  from: string;
  to: string;
  dieselPricePerGallon: string;
  travelMilesPerVisit: string;
  notes: string;
}

function toPayload(values: DraftValues): InvoiceDraftCreateInput {
  return {
    partyId: values.partyId,
    from: values.from,
    to: values.to,
    ...(values.dieselPricePerGallon.trim() ? { dieselPricePerGallon: values.dieselPricePerGallon } : {}),
    ...(values.travelMilesPerVisit.trim() ? { travelMilesPerVisit: values.travelMilesPerVisit } : {}),
    notes: values.notes.trim() ? values.notes : null,
  };
}

function UnbilledHint({ partyId, onUse }: { partyId: string | null; onUse: (from: string, to: string) => void }) {
  const span = useUnbilledSpan(partyId);
  if (!partyId || !span.data) return null;
  const { count, first, last } = span.data;
  if (count === 0 || !first || !last) {
    return (
      <Alert color="slate" variant="light">
        No approved work waits to be billed to this customer. Entries must be approved before they can be invoiced.
      </Alert>
    );
  }
  return (
    <Alert color="harbor" variant="light" icon={<IconCalendarEvent />}>
      <Group justify="space-between" gap="sm">
        <Text size="sm">
          {count} approved {count === 1 ? 'entry waits' : 'entries wait'} to be billed, from {formatDay(first)} to {formatDay(last)}.
        </Text>
        <Button size="sm" variant="white" onClick={() => onUse(first, last)}>
          Use these dates
        </Button>
      </Group>
    </Alert>
  );
}

function NewInvoiceForm() {
  const navigate = useNavigate();
  const customers = useCustomerOptions();
  const create = useCreateDraft();
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: invoiceDraftCreateSchema,
    initialValues: {
      partyId: '',
      from: dayjs().subtract(1, 'month').startOf('month').format('YYYY-MM-DD'),
      to: dayjs().format('YYYY-MM-DD'),
      dieselPricePerGallon: '',
      travelMilesPerVisit: '',
      notes: '',
    } as DraftValues,
    toPayload,
    mutation: create,
    onSuccess: (draft) => navigate(paths.invoice(draft.id)),
  });
  const partyId = form.getValues().partyId || null;

  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="lg" maw={820}>
        <FormErrorAlert message={formError} />
        <Paper withBorder p="md">
          <Stack gap="md">
            <Select
              label="Customer"
              placeholder="Pick the customer to bill"
              data={(customers.data ?? []).map((c) => ({ value: c.id, label: c.name }))}
              searchable
              allowDeselect={false}
              {...form.getInputProps('partyId')}
              onChange={(value) => form.setFieldValue('partyId', value ?? '')}
            />
            <UnbilledHint
              partyId={partyId}
              onUse={(from, to) => {
                form.setFieldValue('from', from);
                form.setFieldValue('to', to);
              }}
            />
            <SimpleGrid cols={{ base: 1, xs: 2 }} spacing="md">
              <TextInput type="date" label="Work from" {...form.getInputProps('from')} />
              <TextInput type="date" label="Work to" {...form.getInputProps('to')} />
            </SimpleGrid>
            <Text size="sm" c="dimmed">
              The invoice takes the customer&apos;s approved work entries in these dates that are on no other invoice or draft, each
              priced with the rate sheet in force on its day. The draft holds them: they cannot be edited or billed elsewhere until it
              is deleted.
            </Text>
            <Textarea label="Note on the invoice (optional)" autosize minRows={2} {...form.getInputProps('notes')} />
          </Stack>
        </Paper>
        <Paper withBorder p="md">
          <Title order={2} size="h5" mb="sm">
            Fuel and travel, only when the rate sheet asks for them
          </Title>
          <SimpleGrid cols={{ base: 1, xs: 2 }} spacing="md">
            <DecimalInput label="Diesel price" prefix="$" unit="/gal" description="For a sheet that adjusts for fuel." {...form.getInputProps('dieselPricePerGallon')} />
            <DecimalInput label="Travel miles per visit" unit="mi" description="There and back, for a sheet that charges per mile." {...form.getInputProps('travelMilesPerVisit')} />
          </SimpleGrid>
        </Paper>
        <Group justify="flex-end">
          <Button variant="default" onClick={() => navigate(paths.invoices())}>
            Cancel
          </Button>
          <Button type="submit" loading={submitting}>
            Preview invoice
          </Button>
        </Group>
      </Stack>
    </form>
  );
}

export function Component() {
  const user = useSessionUserOrThrow();
  if (!canBill(user.role)) return <NotAllowed />;
  return (
    <>
      <PageHeader
        title="New invoice"
        description="Pick a customer and the dates of the work. You see the invoice priced line by line before anything is numbered or sent."
      />
      <NewInvoiceForm />
    </>
  );
}
