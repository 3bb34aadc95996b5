import type { ReactNode } from 'react';
import type { UseFormReturnType } from '@mantine/form';
import { Accordion, Button, Group, Paper, SegmentedControl, Select, SimpleGrid, Stack, Text, TextInput, Textarea, Title } from '@mantine/core';
import { FUEL_TYPES, MACHINE_STATUSES, machineCreateSchema, machineUpdateSchema, type MachineDto } from '@hitchbook/shared/schemas/machines';
import type { Role } from '@hitchbook/shared/roles';
import { DecimalInput } from '../../../components/DecimalInput';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { useCreateMachine } from '../api/createMachine';
import { useHouseholds } from '../api/listHouseholds';
import { useUpdateMachine } from '../api/updateMachine';
import { FUEL_LABELS, STATUS_LABELS } from '../labels';
import { kindOfClass, machineCreatePayload, machineFormValues, machineUpdatePayload, type MachineFormValues } from '../machineForm';
import { MachineClassSelect } from './MachineClassSelect';
import { SharesEditor } from './SharesEditor';


function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <Paper withBorder p="md" radius="md">
      <Stack gap="md">
        <Title order={2} size="h4">
          {title}
        </Title>
        {children}
      </Stack>
    </Paper>
  );
}

interface MachineFieldsProps {
  form: UseFormReturnType<MachineFormValues>;
  editing: boolean;
  role: Role;
  formError: string | null;
  submitting: boolean;
  onCancel: () => void;
}

function MachineFields({ form, editing, role, formError, submitting, onCancel }: MachineFieldsProps) {
  const households = useHouseholds(!editing);
  const values = form.getValues();
  const kind = kindOfClass(values.classId);
  const hasEngine = kind !== 'implement';

  return (
    <>
      <Stack gap="lg" maw={860}>
        <FormErrorAlert message={formError} />
        <Section title="The machine">
          <TextInput label="Name" description="What everyone calls it, for example “Orwin 7R”." withAsterisk {...form.getInputProps('name')} />
          <MachineClassSelect
            label="Class"
            description="Sets the repair and remaining-value curves and the typical field speed."
            placeholder="Pick a class"
            withAsterisk
            data-testid="machine-class"
            {...form.getInputProps('classId')}
          />
          <SimpleGrid cols={{ base: 1, sm: 2 }}>
            <TextInput label="Make" {...form.getInputProps('make')} />
            <TextInput label="Model" {...form.getInputProps('model')} />
            <DecimalInput label="Year" inputMode="numeric" {...form.getInputProps('year')} />
            <TextInput label="Unit number" {...form.getInputProps('unitNumber')} />
            <TextInput label="Serial number" {...form.getInputProps('serialNumber')} />
            <DecimalInput label="Working width" unit="ft" description="Implements and headers, for field capacity." {...form.getInputProps('widthFt')} />
            {hasEngine && (
              <DecimalInput
                label="PTO horsepower"
                unit="hp"
                withAsterisk={kind === 'power'}
                description={kind === 'power' ? 'Needed for fuel use and remaining value.' : undefined}
                {...form.getInputProps('ptoHp')}
              />
            )}
            {hasEngine && (
              <Select
                label="Fuel"
                placeholder="Pick the fuel"
                clearable
                data={FUEL_TYPES.map((f) => ({ value: f, label: FUEL_LABELS[f] }))}
                {...form.getInputProps('fuelType')}
              />
            )}
          </SimpleGrid>
          {editing && (
            <Stack gap={4}>
              <Text size="sm" fw={600}>
                Status
              </Text>
              <SegmentedControl fullWidth data={MACHINE_STATUSES.map((s) => ({ value: s, label: STATUS_LABELS[s] }))} {...form.getInputProps('status')} />
            </Stack>
          )}
        </Section>
        <Section title="Purchase">
          <SimpleGrid cols={{ base: 1, sm: 2 }}>
            <DecimalInput label="List price" prefix="$" {...form.getInputProps('listPrice')} />
            <DecimalInput label="Purchase price" prefix="$" {...form.getInputProps('purchasePrice')} />
            <TextInput label="Purchase date" type="date" {...form.getInputProps('purchaseDate')} />
            <DecimalInput label="Hours at purchase" unit="h" {...form.getInputProps('hoursAtPurchase')} />
          </SimpleGrid>
        </Section>
        {!editing && (
          <Section title="Owners">
            <Text size="sm" c="dimmed">
              {role === 'partner'
                ? 'Leave this empty and your household owns the machine outright; otherwise name your household among the owners.'
                : 'The households that own it, from the purchase date. Shares add up to exactly 100 %; you can also set them later.'}
            </Text>
            <SharesEditor form={form} path="owners" lines={values.owners} households={households.data ?? []} />
          </Section>
        )}
        <Accordion variant="separated" radius="md">
          <Accordion.Item value="planning">
            <Accordion.Control>Planning figures for the estimate</Accordion.Control>
            <Accordion.Panel>
              <SimpleGrid cols={{ base: 1, sm: 2 }}>
                <DecimalInput label="Years you plan to keep it" inputMode="numeric" {...form.getInputProps('plannedYearsOwned')} />
                <DecimalInput label="Hours a year" unit="h/yr" {...form.getInputProps('plannedHoursPerYear')} />
              </SimpleGrid>
              <Text size="sm" c="dimmed" mt="sm">
                Empty fields take the class defaults.
              </Text>
            </Accordion.Panel>
          </Accordion.Item>
        </Accordion>
        <Textarea label="Notes" autosize minRows={2} {...form.getInputProps('notes')} />
        <Group justify="flex-end">
          <Button variant="default" onClick={onCancel}>
            Cancel
          </Button>
          <Button type="submit" loading={submitting}>
            {editing ? 'Save changes' : 'Add machine'}
          </Button>
        </Group>
      </Stack>
    </>
  );
}

interface CreateMachineFormProps {
  role: Role;
  onSaved: (machine: MachineDto) => void;
  onCancel: () => void;
}

export function CreateMachineForm({ role, onSaved, onCancel }: CreateMachineFormProps) {
  const create = useCreateMachine();
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: machineCreateSchema,
    initialValues: machineFormValues(null),
    toPayload: machineCreatePayload,
    mutation: create,
    onSuccess: onSaved,
  });
  return (
    <form onSubmit={onSubmit} noValidate>
      <MachineFields form={form} editing={false} role={role} formError={formError} submitting={submitting} onCancel={onCancel} />
    </form>
  );
}

interface EditMachineFormProps extends CreateMachineFormProps {
  machine: MachineDto;
}

export function EditMachineForm({ machine, role, onSaved, onCancel }: EditMachineFormProps) {
  const update = useUpdateMachine(machine.id);
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: machineUpdateSchema,
    initialValues: machineFormValues(machine),
    toPayload: machineUpdatePayload,
    mutation: update,
    onSuccess: onSaved,
  });
  return (
    <form onSubmit={onSubmit} noValidate>
      <MachineFields form={form} editing role={role} formError={formError} submitting={submitting} onCancel={onCancel} />
    </form>
  );
}
