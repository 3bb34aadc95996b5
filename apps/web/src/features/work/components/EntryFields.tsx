import { useEffect, useState, type ReactNode } from 'react';
import { NativeSelect, Paper, SegmentedControl, SimpleGrid, Stack, Text, TextInput, Textarea, Title } from '@mantine/core';
import type { UseFormReturnType } from '@mantine/form';
import type { FieldDto } from '@hitchbook/shared/schemas/fields';
import type { MachineDto } from '@hitchbook/shared/schemas/machines';
import type { WorkTypeDto } from '@hitchbook/shared/schemas/work-types';
import { DecimalInput } from '../../../components/DecimalInput';
import type { BillToParty } from '../api/listBillToParties';
import { useLastMeterReading } from '../api/lastMeterReading';
import type { Member } from '../api/listMembers';
import { hoursReadout, plainDecimal, type EntryFormValues } from '../entryForm';
import type { LastUsedRig } from '../lastUsed';
import { fieldPickerData, machinePickerData, withBlank, workTypePickerData } from '../pickers';
import { formatQuantity } from '../quantity';
import { CautionAlerts } from './CautionAlerts';

export interface EntryOptions {
  machines: MachineDto[];
  fields: FieldDto[];
  workTypes: WorkTypeDto[];
  parties: BillToParty[];
  /** Only for roles that may log for someone else and read the members list. */
  operators: Member[] | null;
}

// Glove-sized: every control is at least 50 px tall and read at arm's length. The pickers are the phone's
// own (a wheel or a full-screen list), which a gloved thumb works better than a dropdown drawn on the page.
const BIG = 'lg';

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <Paper withBorder radius="md" p="md">
      <Stack gap="md">
        <Title order={2} size="h4">
          {title}
        </Title>
        {children}
      </Stack>
    </Paper>
  );
}

interface EntryFieldsProps {
  form: UseFormReturnType<EntryFormValues>;
  options: EntryOptions;
  operatorName: string;
  lastUsed: LastUsedRig;
  /** On an edit, stored figures are never replaced by suggestions. */
  editing: boolean;
}

export function EntryFields({ form, options, operatorName, lastUsed, editing }: EntryFieldsProps) {
  const values = form.getValues();
  // Suggestions fill a figure only until the operator types over it.
  const [typed, setTyped] = useState({ meterStart: editing, acres: editing, billTo: editing });
  const lastReading = useLastMeterReading(values.timing === 'meter' ? values.powerMachineId || null : null);
  const field = options.fields.find((f) => f.id === values.fieldId) ?? null;
  const workType = options.workTypes.find((t) => t.id === values.workTypeId) ?? null;
  const readout = hoursReadout(values);

  useEffect(() => {
    if (typed.meterStart || lastReading.data === undefined) return;
    form.setFieldValue('meterStart', lastReading.data?.hours ?? '');
    // The form object lives as long as the form; only a new reading should refill the start.
  }, [lastReading.data, typed.meterStart]);

  function pickField(id: string) {
    form.setFieldValue('fieldId', id);
    const picked = options.fields.find((f) => f.id === id);
    if (!picked) return;
    if (!typed.acres) {
      form.setFieldValue('acres', plainDecimal(picked.acres));
      form.setFieldValue('miles', picked.kind === 'roadside' && picked.lengthMiles ? plainDecimal(picked.lengthMiles) : '');
    }
    // The field's owner is who the work is usually for: a neighbour's field, a household's own.
    if (!typed.billTo && picked.ownerPartyId) form.setFieldValue('billToPartyId', picked.ownerPartyId);
  }

  const households = options.parties.filter((p) => p.kind === 'household');
  const customers = options.parties.filter((p) => p.kind === 'customer');

  return (
    <Stack gap="md">
      <Section title="When and who">
        <SimpleGrid cols={{ base: 1, xs: 2 }}>
          <TextInput size={BIG} label="Day of the work" type="date" {...form.getInputProps('workDate')} />
          {options.operators ? (
            <NativeSelect
              size={BIG}
              label="Operator"
              data={options.operators.map((m) => ({ value: m.userId, label: m.name }))}
              {...form.getInputProps('operatorUserId')}
            />
          ) : (
            <TextInput size={BIG} label="Operator" value={operatorName} readOnly variant="filled" />
          )}
        </SimpleGrid>
      </Section>

      <Section title="Where and what">
        <NativeSelect
          size={BIG}
          label="Field or road stretch"
          data={withBlank(fieldPickerData(options.fields), 'Pick where you worked', { disabled: true })}
          {...form.getInputProps('fieldId')}
          onChange={(event) => pickField(event.currentTarget.value)}
          data-testid="entry-field"
        />
        <NativeSelect
          size={BIG}
          label="Work"
          data={withBlank(workTypePickerData(options.workTypes), 'Pick the kind of work', { disabled: true })}
          {...form.getInputProps('workTypeId')}
          data-testid="entry-work-type"
        />
        {workType && <CautionAlerts keys={workType.cautions} />}
      </Section>

      <Section title="Machines">
        <NativeSelect
          size={BIG}
          label="Tractor or self-propelled machine"
          data={withBlank(machinePickerData(options.machines, 'power', lastUsed.powerMachineId), 'None')}
          {...form.getInputProps('powerMachineId')}
          data-testid="entry-power-unit"
        />
        <NativeSelect
          size={BIG}
          label="Implement"
          data={withBlank(machinePickerData(options.machines, 'implement', lastUsed.implementMachineId), 'None')}
          {...form.getInputProps('implementMachineId')}
          data-testid="entry-implement"
        />
      </Section>

      <Section title="Time">
        <SegmentedControl
          size={BIG}
          fullWidth
          aria-label="How you give the time"
          data={[
            { value: 'meter', label: 'Hour meter' },
            { value: 'clock', label: 'Clock' },
            { value: 'hours', label: 'Hours' },
          ]}
          {...form.getInputProps('timing')}
        />
        {values.timing === 'meter' && (
          <SimpleGrid cols={2}>
            <DecimalInput
              size={BIG}
              label="Meter start"
              unit="h"
              {...form.getInputProps('meterStart')}
              onChange={(event) => {
                setTyped((t) => ({ ...t, meterStart: true }));
                form.setFieldValue('meterStart', event.currentTarget.value);
              }}
            />
            <DecimalInput size={BIG} label="Meter end" unit="h" {...form.getInputProps('meterEnd')} />
          </SimpleGrid>
        )}
        {values.timing === 'meter' && lastReading.data && !typed.meterStart && (
          <Text size="sm" c="dimmed">
            Meter start is the machine&apos;s last reading.
          </Text>
        )}
        {values.timing === 'clock' && (
          <SimpleGrid cols={2}>
            <TextInput size={BIG} label="Started" type="time" {...form.getInputProps('startTime')} />
            <TextInput size={BIG} label="Finished" type="time" {...form.getInputProps('endTime')} />
          </SimpleGrid>
        )}
        {values.timing === 'hours' && <DecimalInput size={BIG} label="Machine hours" unit="h" {...form.getInputProps('hours')} />}
        <Text size="xl" fw={700} aria-live="polite" data-testid="hours-readout">
          {readout.hours ? `${formatQuantity(readout.hours, values.timing === 'meter' ? 1 : 2)} h` : '— h'}
        </Text>
        {readout.problem && (
          <Text c="red.8" fw={600} role="alert">
            {readout.problem}
          </Text>
        )}
        {readout.long && <Text c="clay.8">That is a long day. Check the figures; the entry is still saved if they are right.</Text>}
      </Section>

      <Section title="What got done">
        <SimpleGrid cols={2}>
          <DecimalInput
            size={BIG}
            label="Acres"
            unit="ac"
            {...form.getInputProps('acres')}
            onChange={(event) => {
              setTyped((t) => ({ ...t, acres: true }));
              form.setFieldValue('acres', event.currentTarget.value);
            }}
          />
          {field?.kind === 'roadside' && <DecimalInput size={BIG} label="Miles" unit="mi" {...form.getInputProps('miles')} />}
          {workType?.defaultUnit === 'load' && <DecimalInput size={BIG} label="Loads" {...form.getInputProps('loads')} />}
          <DecimalInput size={BIG} label="Fuel added" unit="gal" {...form.getInputProps('fuelGallons')} />
        </SimpleGrid>
        {field && !typed.acres && (
          <Text size="sm" c="dimmed">
            Acres are the whole {field.kind === 'roadside' ? 'stretch' : 'field'}; change them for a partial pass.
          </Text>
        )}
      </Section>

      <Section title="Bill to">
        <NativeSelect
          size={BIG}
          label="Who the work is for"
          data={withBlank(
            [
              { group: 'Households', items: households.map((p) => ({ value: p.id, label: p.name })) },
              { group: 'Customers', items: customers.map((p) => ({ value: p.id, label: p.name })) },
            ].filter((g) => g.items.length > 0),
            'Pick a household or customer',
            { disabled: true },
          )}
          {...form.getInputProps('billToPartyId')}
          onChange={(event) => {
            const id = event.currentTarget.value;
            setTyped((t) => ({ ...t, billTo: true }));
            form.setFieldValue('billToPartyId', id);
          }}
          data-testid="entry-bill-to"
        />
        <Textarea size={BIG} label="Notes" autosize minRows={2} {...form.getInputProps('notes')} />
      </Section>
    </Stack>
  );
}
