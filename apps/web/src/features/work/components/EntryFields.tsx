import { lazy, Suspense, useEffect, useState, type ReactNode } from 'react';
import { Button, InputBase, NativeSelect, Paper, Stack, Text, TextInput, Title } from '@mantine/core';
import type { FieldDto } from '@hitchbook/shared/schemas/fields';
import type { MachineDto, MeterReadingDto } from '@hitchbook/shared/schemas/machines';
import type { WorkTypeDto } from '@hitchbook/shared/schemas/work-types';
import { DecimalInput } from '../../../components/DecimalInput';
import { FormGrid } from '../../../components/FormGrid';
import type { BillToParty } from '../api/listBillToParties';
import type { Member } from '../api/listMembers';
import { hoursReadout, plainDecimal, type TimingMode } from '../entryForm';
import type { LastUsedRig } from '../lastUsed';
import { fieldPickerData, machinePickerData, withBlank, workTypePickerData } from '../pickers';
import { formatQuantity } from '../quantity';
import type { EntryFormControls } from '../useEntryForm';

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

// Shown only once a kind of work with cautions is picked, so its texts load after the form is drawn.
const CautionAlerts = lazy(() => import('./CautionAlerts').then((module) => ({ default: module.CautionAlerts })));

const TIMINGS: { value: TimingMode; label: string }[] = [
  { value: 'meter', label: 'Hour meter' },
  { value: 'clock', label: 'Clock' },
  { value: 'hours', label: 'Hours' },
];

/** Three big buttons, one pressed: how the operator gives the time. */
function TimingChoice({ value, onChange }: { value: string; onChange: (timing: TimingMode) => void }) {
  return (
    <Button.Group aria-label="How you give the time">
      {TIMINGS.map((timing) => (
        <Button
          key={timing.value}
          size={BIG}
          flex={1}
          // Three labels side by side on a phone held upright.
          px={4}
          fz="md"
          variant={value === timing.value ? 'filled' : 'default'}
          aria-pressed={value === timing.value}
          onClick={() => onChange(timing.value)}
        >
          {timing.label}
        </Button>
      ))}
    </Button.Group>
  );
}

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
  form: EntryFormControls;
  options: EntryOptions;
  operatorName: string;
  lastUsed: LastUsedRig;
  /** On an edit, stored figures are never replaced by suggestions. */
  editing: boolean;
  /** The power unit's last meter reading (null: none yet; left out: not known), suggested as the meter start. */
  lastReading?: MeterReadingDto | null;
}

export function EntryFields({ form, options, operatorName, lastUsed, editing, lastReading }: EntryFieldsProps) {
  const values = form.getValues();
  // Suggestions fill a figure only until the operator types over it.
  const [typed, setTyped] = useState({ meterStart: editing, acres: editing, billTo: editing });
  const field = options.fields.find((f) => f.id === values.fieldId) ?? null;
  const workType = options.workTypes.find((t) => t.id === values.workTypeId) ?? null;
  const readout = hoursReadout(values);

  useEffect(() => {
    if (typed.meterStart || lastReading === undefined) return;
    form.setFieldValue('meterStart', lastReading?.hours ?? '');
    // The form object lives as long as the form; only a new reading should refill the start.
  }, [lastReading, typed.meterStart]);

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
        <FormGrid>
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
        </FormGrid>
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
        {workType && workType.cautions.length > 0 && (
          <Suspense fallback={null}>
            <CautionAlerts keys={workType.cautions} />
          </Suspense>
        )}
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
        <TimingChoice value={values.timing} onChange={(timing) => form.setFieldValue('timing', timing)} />
        {values.timing === 'meter' && (
          <FormGrid alwaysTwo>
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
          </FormGrid>
        )}
        {values.timing === 'meter' && lastReading && !typed.meterStart && (
          <Text size="sm" c="dimmed">
            Meter start is the machine&apos;s last reading.
          </Text>
        )}
        {values.timing === 'clock' && (
          <FormGrid alwaysTwo>
            <TextInput size={BIG} label="Started" type="time" {...form.getInputProps('startTime')} />
            <TextInput size={BIG} label="Finished" type="time" {...form.getInputProps('endTime')} />
          </FormGrid>
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
        <FormGrid alwaysTwo>
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
        </FormGrid>
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
        <InputBase component="textarea" multiline rows={3} size={BIG} label="Notes" {...form.getInputProps('notes')} />
      </Section>
    </Stack>
  );
}
