import { ActionIcon, Badge, Button, Grid, Group, Select, Stack, Text } from '@mantine/core';
import type { UseFormReturnType } from '@mantine/form';
import { IconPlus, IconTrash } from '@tabler/icons-react';
import { DecimalInput } from '../../../components/DecimalInput';
import type { Household } from '../api/listHouseholds';
import { tallyShares, type ShareLineValues } from '../shares';

// Mantine's own constraint on form values; unlike Record<string, unknown> it accepts interfaces.
type FormValues = Record<string, any>;

interface SharesEditorProps<Values extends FormValues> {
  form: UseFormReturnType<Values>;
  /** Where the lines sit in the form's values. */
  path: 'owners' | 'shares';
  lines: ShareLineValues[];
  households: Household[];
}

/** Owning households and their shares, with the running total beside them as they are typed. */
export function SharesEditor<Values extends FormValues>({ form, path, lines, households }: SharesEditorProps<Values>) {
  const tally = tallyShares(lines);
  const listError = form.errors[path];
  return (
    <Stack gap="sm">
      {lines.map((line, index) => {
        // A household already named on another line is not offered again.
        const taken = new Set(lines.filter((_, i) => i !== index).map((l) => l.partyId));
        return (
          <Grid key={index} gutter="sm" align="flex-end">
            <Grid.Col span={{ base: 12, xs: 7 }}>
              <Select
                label={index === 0 ? 'Household' : undefined}
                aria-label={`Household ${index + 1}`}
                placeholder="Pick a household"
                data={households.filter((h) => !taken.has(h.id) || h.id === line.partyId).map((h) => ({ value: h.id, label: h.name }))}
                allowDeselect={false}
                {...form.getInputProps(`${path}.${index}.partyId`)}
              />
            </Grid.Col>
            <Grid.Col span={{ base: 9, xs: 4 }}>
              <DecimalInput
                label={index === 0 ? 'Share' : undefined}
                aria-label={`Share of household ${index + 1}`}
                unit="%"
                {...form.getInputProps(`${path}.${index}.sharePct`)}
              />
            </Grid.Col>
            <Grid.Col span={{ base: 3, xs: 1 }}>
              <ActionIcon variant="subtle" color="red" size={48} aria-label={`Remove household ${index + 1}`} onClick={() => form.removeListItem(path, index)}>
                <IconTrash />
              </ActionIcon>
            </Grid.Col>
          </Grid>
        );
      })}
      <Group justify="space-between" gap="sm">
        <Button
          variant="light"
          leftSection={<IconPlus size={18} />}
          disabled={lines.length >= households.length}
          onClick={() => form.insertListItem(path, { partyId: '', sharePct: lines.length === 0 ? '100' : '' })}
        >
          Add a household
        </Button>
        {lines.length > 0 && (
          <Badge size="xl" tt="none" variant="light" color={tally.complete ? 'harbor' : 'clay'} data-testid="shares-total">
            Total {tally.total.toString()} %
            {!tally.complete && tally.remaining.gt(0) && ` · ${tally.remaining.toString()} % to give`}
            {tally.remaining.lt(0) && ` · ${tally.remaining.negated().toString()} % too much`}
          </Badge>
        )}
      </Group>
      {listError && (
        <Text c="red.8" size="sm" role="alert" data-testid="shares-error">
          {listError}
        </Text>
      )}
    </Stack>
  );
}
