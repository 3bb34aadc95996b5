import type { ReactNode } from 'react';
import { Alert, Button, Group, Paper, SegmentedControl, Select, SimpleGrid, Skeleton, Stack, Switch, Text, TextInput, Textarea, Title } from '@mantine/core';
import type { UseFormReturnType } from '@mantine/form';
import { IconInfoCircle } from '@tabler/icons-react';
import dayjs from 'dayjs';
import { useNavigate, useParams } from 'react-router-dom';
import {
  MINIMUM_PER,
  RATE_RELATIONSHIPS,
  rateSheetCreateSchema,
  rateSheetUpdateSchema,
  type RateRelationship,
  type RateSheetDto,
} from '@hitchbook/shared/schemas/rate-sheets';
import { DecimalInput } from '../../../components/DecimalInput';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { NotAllowed } from '../../../components/NotAllowed';
import { NotFound } from '../../../components/NotFound';
import { PageHeader } from '../../../components/PageHeader';
import { QueryError } from '../../../components/QueryError';
import { isApiError } from '../../../lib/api';
import { accessTo } from '../../../lib/areas';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { useServerForm } from '../../../lib/form';
import { paths } from '../../../lib/paths';
import { useCreateRateSheet } from '../api/createRateSheet';
import { useRateSheet } from '../api/getRateSheet';
import { useMachineOptions, usePartyOptions, useWorkTypeOptions, type PartyOption } from '../api/listSheetOptions';
import { useUpdateRateSheet } from '../api/updateRateSheet';
import { MachineRatesEditor } from '../components/MachineRatesEditor';
import { RateLinesEditor } from '../components/RateLinesEditor';
import { MINIMUM_PER_LABELS, RELATIONSHIP_LABELS, SHEET_CHANGE_NOTE } from '../labels';
import { newSheetValues, toRateSheetPayload, valuesFromSheet, type RateSheetFormValues } from '../rateSheetForm';

/** A repeated line is reported on the row as a whole; its work type is where the owner fixes it. */
function issuePath(path: string): string {
  const row = /^lines\.(\d+)$/.exec(path);
  return row ? `lines.${row[1]}.workTypeId` : path;
}

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <Paper withBorder p="md">
      <Title order={2} size="h4" mb="md">
        {title}
      </Title>
      {children}
    </Paper>
  );
}

function SheetFields({ form, parties }: { form: UseFormReturnType<RateSheetFormValues>; parties: PartyOption[] }) {
  const partyOptions = parties.map((p) => ({ value: p.id, label: `${p.name} (${RELATIONSHIP_LABELS[p.relationship].toLowerCase()})` }));
  return (
    <Stack gap="md">
      <TextInput label="Name" placeholder="Neighbour custom rates" {...form.getInputProps('name')} />
      <SimpleGrid cols={{ base: 1, sm: 2 }} spacing="md">
        <Select
          label="Relationship"
          description="Prices the work of every party billed as this relationship."
          data={RATE_RELATIONSHIPS.map((r) => ({ value: r, label: RELATIONSHIP_LABELS[r] }))}
          allowDeselect={false}
          {...form.getInputProps('relationship')}
          onChange={(value) => form.setFieldValue('relationship', (value ?? 'neighbour') as RateRelationship)}
        />
        <Select
          label="For one party only (optional)"
          description="An override sheet: it prices this party's work instead of the relationship's sheet."
          placeholder="Every party of the relationship"
          data={partyOptions}
          searchable
          clearable
          {...form.getInputProps('partyId')}
          onChange={(value) => {
            form.setFieldValue('partyId', value ?? '');
            // An override must be of the party's own relationship, so follow it rather than let the server refuse.
            const party = parties.find((p) => p.id === value);
            if (party) form.setFieldValue('relationship', party.relationship);
          }}
        />
        <TextInput type="date" label="In force from" description="Work on or after this day is priced with this sheet." {...form.getInputProps('effectiveFrom')} />
        <TextInput
          label="Payment due"
          description="Days after the invoice date."
          inputMode="numeric"
          rightSection={<Text c="dimmed" size="sm">days</Text>}
          rightSectionWidth={52}
          {...form.getInputProps('termsDays')}
        />
      </SimpleGrid>
      <Textarea label="Notes" autosize minRows={2} {...form.getInputProps('notes')} />
    </Stack>
  );
}

function ChargeFields({ form }: { form: UseFormReturnType<RateSheetFormValues> }) {
  const adjusts = form.getValues().adjustsForFuel;
  return (
    <Stack gap="md">
      <SimpleGrid cols={{ base: 1, sm: 2 }} spacing="md">
        <DecimalInput label="Minimum charge" prefix="$" {...form.getInputProps('minimumCharge')} />
        <Stack gap={4}>
          <Text size="sm" fw={500}>
            Minimum applies
          </Text>
          <SegmentedControl
            aria-label="Minimum applies"
            data={MINIMUM_PER.map((m) => ({ value: m, label: MINIMUM_PER_LABELS[m] }))}
            {...form.getInputProps('minimumPer')}
          />
          <Text size="xs" c="dimmed">
            Per visit: one minimum for all the work done at a party&apos;s place on one day.
          </Text>
        </Stack>
        <DecimalInput label="Travel charge per visit" prefix="$" {...form.getInputProps('travelFlat')} />
        <DecimalInput label="Travel charge per mile" prefix="$" unit="/mile" {...form.getInputProps('travelPerMile')} />
      </SimpleGrid>
      <Switch
        label="Adjust custom rates for the price of diesel"
        {...form.getInputProps('adjustsForFuel', { type: 'checkbox' })}
      />
      {adjusts && (
        <SimpleGrid cols={{ base: 1, sm: 3 }} spacing="md">
          <DecimalInput label="Base diesel price" prefix="$" unit="/gal" {...form.getInputProps('fuelAdjustment.basePricePerGallon')} />
          <DecimalInput label="Step" prefix="$" unit="/gal" description="Each whole step above or below the base…" {...form.getInputProps('fuelAdjustment.stepPerGallon')} />
          <DecimalInput label="Change per step" unit="%" description="…moves custom rates by this much." {...form.getInputProps('fuelAdjustment.pctPerStep')} />
        </SimpleGrid>
      )}
    </Stack>
  );
}

function OperatorFields({ form }: { form: UseFormReturnType<RateSheetFormValues> }) {
  return (
    <SimpleGrid cols={{ base: 1, sm: 2 }} spacing="md">
      <DecimalInput label="Operator wage" description="Billed per labour hour when an operator goes with a rental." prefix="$" unit="/h" {...form.getInputProps('operatorWage')} />
      <DecimalInput label="Labour factor" description="Labour hours per machine hour (travel, fuelling, greasing)." unit="× machine h" {...form.getInputProps('laborFactor')} />
    </SimpleGrid>
  );
}

function RateSheetForm({ sheet }: { sheet: RateSheetDto | null }) {
  const navigate = useNavigate();
  const workTypes = useWorkTypeOptions();
  const machines = useMachineOptions();
  const parties = usePartyOptions();
  const create = useCreateRateSheet();
  const update = useUpdateRateSheet(sheet?.id ?? '');
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: sheet ? rateSheetUpdateSchema : rateSheetCreateSchema,
    initialValues: sheet ? valuesFromSheet(sheet) : newSheetValues(dayjs().format('YYYY-MM-DD')),
    toPayload: toRateSheetPayload,
    mutation: sheet ? update : create,
    issuePath,
    onSuccess: (saved) => navigate(paths.rateSheet(saved.id)),
  });

  const pickersFailed = workTypes.error ?? machines.error ?? parties.error;
  if (pickersFailed) return <QueryError error={pickersFailed} />;

  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="lg">
        <FormErrorAlert message={formError} />
        <Section title="The sheet">
          <SheetFields form={form} parties={parties.data ?? []} />
        </Section>
        <Section title="Rates per work type">
          <RateLinesEditor form={form} workTypes={workTypes.data ?? []} />
        </Section>
        <Section title="Minimum, travel and fuel">
          <ChargeFields form={form} />
        </Section>
        <Section title="Operator and machine-hour rates">
          <Stack gap="lg">
            <OperatorFields form={form} />
            <MachineRatesEditor form={form} machines={machines.data ?? []} />
          </Stack>
        </Section>
        <Alert color="harbor" variant="light" icon={<IconInfoCircle />}>
          {SHEET_CHANGE_NOTE}
        </Alert>
        <Group justify="flex-end">
          <Button variant="default" onClick={() => navigate(sheet ? paths.rateSheet(sheet.id) : paths.rateSheets())}>
            Cancel
          </Button>
          <Button type="submit" loading={submitting}>
            {sheet ? 'Save changes' : 'Add rate sheet'}
          </Button>
        </Group>
      </Stack>
    </form>
  );
}

function EditSheet({ sheetId }: { sheetId: string }) {
  const sheet = useRateSheet(sheetId);
  if (sheet.isError && isApiError(sheet.error) && (sheet.error.status === 404 || sheet.error.status === 400)) return <NotFound />;
  if (sheet.isError) return <QueryError error={sheet.error} onRetry={() => void sheet.refetch()} />;
  if (sheet.isPending) return <Skeleton h={480} />;
  return (
    <>
      <PageHeader title={`Edit ${sheet.data.name}`} />
      <RateSheetForm key={sheet.data.id} sheet={sheet.data} />
    </>
  );
}

export function Component() {
  const { sheetId } = useParams();
  const user = useSessionUserOrThrow();
  if (accessTo(user.role, 'rates') !== 'manage') return <NotAllowed />;
  if (sheetId) return <EditSheet sheetId={sheetId} />;
  return (
    <>
      <PageHeader title="New rate sheet" description="Rates for one relationship, or for one party, from a given day." />
      <RateSheetForm sheet={null} />
    </>
  );
}
