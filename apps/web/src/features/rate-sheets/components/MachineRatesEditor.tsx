import { ActionIcon, Button, Grid, Select, Stack, Text, Tooltip } from '@mantine/core';
import type { UseFormReturnType } from '@mantine/form';
import { IconPlus, IconTrash } from '@tabler/icons-react';
import { DecimalInput } from '../../../components/DecimalInput';
import type { MachineOption } from '../api/listSheetOptions';
import { emptyMachineRate, type RateSheetFormValues } from '../rateSheetForm';

interface MachineRatesEditorProps {
  form: UseFormReturnType<RateSheetFormValues>;
  machines: MachineOption[];
}

export function MachineRatesEditor({ form, machines }: MachineRatesEditorProps) {
  const options = machines.map((m) => ({ value: m.id, label: m.name }));
  const rates = form.getValues().machineRates;
  return (
    <Stack gap="sm">
      <Text size="sm" c="dimmed">
        What one household pays for an hour of another household&apos;s machine.
      </Text>
      {rates.map((rate, index) => {
        const n = index + 1;
        return (
          <Grid key={rate.key} gutter="sm" align="flex-start">
            <Grid.Col span={{ base: 12, sm: 7 }}>
              <Select
                aria-label={`Machine, machine rate ${n}`}
                placeholder="Pick a machine"
                data={options}
                searchable
                allowDeselect={false}
                {...form.getInputProps(`machineRates.${index}.machineId`)}
              />
            </Grid.Col>
            <Grid.Col span={{ base: 10, sm: 4 }}>
              <DecimalInput aria-label={`Rate per hour, machine rate ${n}`} prefix="$" unit="/h" {...form.getInputProps(`machineRates.${index}.ratePerHour`)} />
            </Grid.Col>
            <Grid.Col span={{ base: 2, sm: 1 }} pt={6}>
              <Tooltip label={`Remove machine rate ${n}`}>
                <ActionIcon variant="subtle" color="red" size="lg" aria-label={`Remove machine rate ${n}`} onClick={() => form.removeListItem('machineRates', index)}>
                  <IconTrash size={20} />
                </ActionIcon>
              </Tooltip>
            </Grid.Col>
          </Grid>
        );
      })}
      <div>
        <Button variant="light" leftSection={<IconPlus size={18} />} onClick={() => form.insertListItem('machineRates', emptyMachineRate())}>
          Add a machine rate
        </Button>
      </div>
    </Stack>
  );
}
