import { ActionIcon, Button, Grid, SegmentedControl, Select, Stack, Text, Tooltip } from '@mantine/core';
import type { UseFormReturnType } from '@mantine/form';
import { useMediaQuery } from '@mantine/hooks';
import { IconPlus, IconTrash } from '@tabler/icons-react';
import { CHARGE_TYPES } from '@hitchbook/shared/schemas/rate-sheets';
import { WORK_UNITS, type WorkUnit } from '@hitchbook/shared/work-types';
import { DecimalInput } from '../../../components/DecimalInput';
import type { WorkTypeOption } from '../api/listSheetOptions';
import { CHARGE_TYPE_LABELS, CHARGE_TYPE_NOTE, UNIT_LABELS } from '../labels';
import { emptyLine, type RateSheetFormValues } from '../rateSheetForm';

interface RateLinesEditorProps {
  form: UseFormReturnType<RateSheetFormValues>;
  workTypes: WorkTypeOption[];
}

const unitOptions = WORK_UNITS.map((u) => ({ value: u, label: UNIT_LABELS[u] }));
const chargeOptions = CHARGE_TYPES.map((c) => ({ value: c, label: CHARGE_TYPE_LABELS[c] }));

/** One row per work type, unit and charge type; on a phone each row's fields stack with their labels. */
export function RateLinesEditor({ form, workTypes }: RateLinesEditorProps) {
  const phone = useMediaQuery('(max-width: 62em)');
  const workTypeOptions = workTypes.map((t) => ({ value: t.id, label: t.archived ? `${t.name} (archived)` : t.name }));
  const lines = form.getValues().lines;

  return (
    <Stack gap="sm">
      <Text size="sm" c="dimmed">
        {CHARGE_TYPE_NOTE} A line minimum left blank uses the sheet&apos;s minimum.
      </Text>
      {!phone && lines.length > 0 && (
        <Grid gutter="sm" c="dimmed" fz="sm" fw={600}>
          <Grid.Col span={3}>Work type</Grid.Col>
          <Grid.Col span={1.5}>Unit</Grid.Col>
          <Grid.Col span={2.5}>Charge</Grid.Col>
          <Grid.Col span={2.5}>Rate</Grid.Col>
          <Grid.Col span={2}>Minimum</Grid.Col>
        </Grid>
      )}
      {lines.map((line, index) => {
        const n = index + 1;
        const field = (name: string) => form.getInputProps(`lines.${index}.${name}`);
        return (
          <Grid key={line.key} gutter="sm" align="flex-start" pb={phone ? 'md' : 0} style={phone ? { borderBottom: '1px solid var(--mantine-color-slate-2)' } : undefined}>
            <Grid.Col span={{ base: 12, md: 3 }}>
              <Select
                label={phone ? `Work type (rate ${n})` : undefined}
                aria-label={`Work type, rate ${n}`}
                placeholder="Pick a work type"
                data={workTypeOptions}
                searchable
                allowDeselect={false}
                {...field('workTypeId')}
                onChange={(value) => {
                  form.setFieldValue(`lines.${index}.workTypeId`, value ?? '');
                  // A new pick starts from that work type's usual unit; the owner may change it after.
                  const unit = workTypes.find((t) => t.id === value)?.defaultUnit;
                  if (unit) form.setFieldValue(`lines.${index}.unit`, unit);
                }}
              />
            </Grid.Col>
            <Grid.Col span={{ base: 6, md: 1.5 }}>
              <Select
                label={phone ? 'Unit' : undefined}
                aria-label={`Unit, rate ${n}`}
                data={unitOptions}
                allowDeselect={false}
                {...field('unit')}
                onChange={(value) => form.setFieldValue(`lines.${index}.unit`, (value ?? 'acre') as WorkUnit)}
              />
            </Grid.Col>
            <Grid.Col span={{ base: 6, md: 2.5 }}>
              <Stack gap={4}>
                {phone && (
                  <Text size="sm" fw={500}>
                    Charge
                  </Text>
                )}
                <SegmentedControl fullWidth aria-label={`Charge type, rate ${n}`} data={chargeOptions} {...field('chargeType')} />
              </Stack>
            </Grid.Col>
            <Grid.Col span={{ base: 6, md: 2.5 }}>
              <DecimalInput
                label={phone ? 'Rate' : undefined}
                aria-label={`Rate, rate ${n}`}
                prefix="$"
                unit={`/${UNIT_LABELS[line.unit]}`}
                {...field('rate')}
              />
            </Grid.Col>
            <Grid.Col span={{ base: 5, md: 2 }}>
              <DecimalInput
                label={phone ? 'Minimum' : undefined}
                aria-label={`Minimum, rate ${n}`}
                prefix="$"
                placeholder="Sheet"
                {...field('minimumCharge')}
              />
            </Grid.Col>
            <Grid.Col span={{ base: 1, md: 0.5 }} pt={phone ? 34 : 6}>
              <Tooltip label={`Remove rate ${n}`}>
                <ActionIcon variant="subtle" color="red" size="lg" aria-label={`Remove rate ${n}`} onClick={() => form.removeListItem('lines', index)}>
                  <IconTrash size={20} />
                </ActionIcon>
              </Tooltip>
            </Grid.Col>
          </Grid>
        );
      })}
      <div>
        <Button variant="light" leftSection={<IconPlus size={18} />} onClick={() => form.insertListItem('lines', emptyLine())}>
          Add a rate
        </Button>
      </div>
    </Stack>
  );
}
