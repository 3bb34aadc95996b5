import { useState } from 'react';
import { Alert, Badge, Button, Group, Paper, SimpleGrid, Skeleton, Stack, Table, Text, Title } from '@mantine/core';
import { IconArchive, IconInfoCircle, IconPencil } from '@tabler/icons-react';
import { useMediaQuery } from '@mantine/hooks';
import { Link, useParams } from 'react-router-dom';
import { formatMoney } from '@hitchbook/shared/money';
import type { RateSheetDto } from '@hitchbook/shared/schemas/rate-sheets';
import { NotFound } from '../../../components/NotFound';
import { PageHeader } from '../../../components/PageHeader';
import { QueryError } from '../../../components/QueryError';
import { isApiError } from '../../../lib/api';
import { accessTo } from '../../../lib/areas';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { formatDecimal } from '../../../lib/money';
import { paths } from '../../../lib/paths';
import { useRateSheet } from '../api/getRateSheet';
import { ArchiveSheetModal } from '../components/ArchiveSheetModal';
import { FactList } from '../components/FactList';
import {
  CHARGE_TYPE_LABELS,
  CHARGE_TYPE_NOTE,
  formatDay,
  MINIMUM_PER_LABELS,
  RELATIONSHIP_COLORS,
  RELATIONSHIP_LABELS,
  SHEET_CHANGE_NOTE,
} from '../labels';
import { formatUnitRate } from '../rates';

function RatesTable({ sheet }: { sheet: RateSheetDto }) {
  const phone = useMediaQuery('(max-width: 48em)');
  const sheetMinimum = sheet.minimumCharge === '0.00' ? 'none' : `${formatMoney(sheet.minimumCharge)} (sheet)`;
  return (
    <Paper withBorder p="md">
      <Title order={2} size="h4" mb={4}>
        Rates per work type
      </Title>
      <Text size="sm" c="dimmed" mb="sm">
        {CHARGE_TYPE_NOTE}
      </Text>
      {sheet.lines.length === 0 ? (
        <Text c="dimmed">No rates on this sheet yet: work priced with it would be refused.</Text>
      ) : phone ? (
        <Stack gap={0}>
          {sheet.lines.map((line) => (
            <Group key={line.id} justify="space-between" wrap="nowrap" py="xs" style={{ borderBottom: '1px solid var(--mantine-color-slate-2)' }}>
              <Stack gap={0} miw={0}>
                <Text fw={600}>{line.workTypeName}</Text>
                <Text size="sm" c="dimmed">
                  {CHARGE_TYPE_LABELS[line.chargeType]} · minimum {line.minimumCharge ? formatMoney(line.minimumCharge) : sheetMinimum}
                </Text>
              </Stack>
              <Text fw={700} style={{ whiteSpace: 'nowrap' }}>
                {formatUnitRate(line.rate, line.unit)}
              </Text>
            </Group>
          ))}
        </Stack>
      ) : (
        <Table striped verticalSpacing="sm">
          <Table.Thead>
            <Table.Tr>
              <Table.Th>Work type</Table.Th>
              <Table.Th>Charge</Table.Th>
              <Table.Th ta="right">Rate</Table.Th>
              <Table.Th ta="right">Minimum</Table.Th>
            </Table.Tr>
          </Table.Thead>
          <Table.Tbody>
            {sheet.lines.map((line) => (
              <Table.Tr key={line.id}>
                <Table.Td fw={600}>{line.workTypeName}</Table.Td>
                <Table.Td>{CHARGE_TYPE_LABELS[line.chargeType]}</Table.Td>
                <Table.Td ta="right" style={{ whiteSpace: 'nowrap' }}>
                  {formatUnitRate(line.rate, line.unit)}
                </Table.Td>
                <Table.Td ta="right" c={line.minimumCharge ? undefined : 'dimmed'}>
                  {line.minimumCharge ? formatMoney(line.minimumCharge) : sheetMinimum}
                </Table.Td>
              </Table.Tr>
            ))}
          </Table.Tbody>
        </Table>
      )}
    </Paper>
  );
}

function ChargesPanel({ sheet }: { sheet: RateSheetDto }) {
  const fuel = sheet.fuelAdjustment;
  const travel = [
    sheet.travelFlat !== '0.00' ? `${formatMoney(sheet.travelFlat)} a visit` : null,
    sheet.travelPerMile !== '0.0000' ? formatUnitRate(sheet.travelPerMile, 'mile') : null,
  ].filter(Boolean);
  return (
    <Paper withBorder p="md">
      <Title order={2} size="h4" mb="sm">
        Charges
      </Title>
      <FactList
        facts={[
          {
            label: 'Minimum charge',
            value: sheet.minimumCharge === '0.00' ? 'None' : `${formatMoney(sheet.minimumCharge)} ${MINIMUM_PER_LABELS[sheet.minimumPer]}`,
            hint: 'Work that prices below the minimum is billed at the minimum.',
          },
          { label: 'Travel', value: travel.length > 0 ? travel.join(' + ') : 'None' },
          {
            label: 'Fuel adjustment',
            value: fuel
              ? `${formatDecimal(fuel.pctPerStep, 2)} % per $${formatDecimal(fuel.stepPerGallon, 2)}/gal from $${formatDecimal(fuel.basePricePerGallon, 2)}/gal`
              : 'None',
            hint: fuel
              ? 'Custom rates rise (or fall) by that share for each whole step diesel is above (or below) the base price; rentals are not adjusted.'
              : undefined,
          },
          { label: 'Payment due', value: `${sheet.termsDays} days after the invoice date` },
        ]}
      />
    </Paper>
  );
}

function OperatorAndMachinesPanel({ sheet }: { sheet: RateSheetDto }) {
  return (
    <Paper withBorder p="md">
      <Title order={2} size="h4" mb="sm">
        Operator and machines
      </Title>
      <FactList
        facts={[
          {
            label: 'Operator wage',
            value: sheet.operatorWage === '0.00' ? 'None' : formatUnitRate(sheet.operatorWage, 'h'),
            hint: 'Billed when an operator goes out with a rental.',
          },
          {
            label: 'Labour factor',
            value: `${formatDecimal(sheet.laborFactor, 2)} labour h per machine h`,
            hint: 'Covers travel, fuelling and greasing around each machine hour.',
          },
        ]}
      />
      <Text fw={700} mt="md" mb="xs">
        Machine-hour rates
      </Text>
      {sheet.machineRates.length === 0 ? (
        <Text c="dimmed" size="sm">
          None on this sheet.
        </Text>
      ) : (
        <Table verticalSpacing={6}>
          <Table.Tbody>
            {sheet.machineRates.map((rate) => (
              <Table.Tr key={rate.id}>
                <Table.Td>{rate.machineName}</Table.Td>
                <Table.Td ta="right" style={{ whiteSpace: 'nowrap' }}>
                  {formatUnitRate(rate.ratePerHour, 'h')}
                </Table.Td>
              </Table.Tr>
            ))}
          </Table.Tbody>
        </Table>
      )}
    </Paper>
  );
}

export function Component() {
  const { sheetId = '' } = useParams();
  const user = useSessionUserOrThrow();
  const canManage = accessTo(user.role, 'rates') === 'manage';
  const sheet = useRateSheet(sheetId);
  const [archiving, setArchiving] = useState(false);

  if (sheet.isError && isApiError(sheet.error) && (sheet.error.status === 404 || sheet.error.status === 400)) return <NotFound />;
  if (sheet.isError) return <QueryError error={sheet.error} onRetry={() => void sheet.refetch()} />;
  if (sheet.isPending) return <Skeleton h={420} />;
  const s = sheet.data;

  return (
    <Stack gap="lg">
      <PageHeader
        title={s.name}
        description={
          <Group gap="xs" component="span">
            <Badge component="span" color={RELATIONSHIP_COLORS[s.relationship]} variant="light" size="lg">
              {RELATIONSHIP_LABELS[s.relationship]}
            </Badge>
            <span>
              In force from {formatDay(s.effectiveFrom)}
              {s.partyName ? ` · for ${s.partyName} only` : ''}
            </span>
          </Group>
        }
        actions={
          canManage &&
          !s.archivedAt && (
            <>
              <Button component={Link} to={paths.editRateSheet(s.id)} leftSection={<IconPencil size={18} />}>
                Edit
              </Button>
              <Button variant="default" leftSection={<IconArchive size={18} />} onClick={() => setArchiving(true)}>
                Archive
              </Button>
            </>
          )
        }
      />
      {s.archivedAt && (
        <Alert color="slate" icon={<IconArchive />} title="Archived">
          This sheet prices no new work since {formatDay(s.archivedAt)}.
        </Alert>
      )}
      <Alert color="harbor" variant="light" icon={<IconInfoCircle />}>
        {SHEET_CHANGE_NOTE}
      </Alert>
      <RatesTable sheet={s} />
      <SimpleGrid cols={{ base: 1, md: 2 }} spacing="lg">
        <ChargesPanel sheet={s} />
        <OperatorAndMachinesPanel sheet={s} />
      </SimpleGrid>
      {s.notes && (
        <Paper withBorder p="md">
          <Title order={2} size="h4" mb="xs">
            Notes
          </Title>
          <Text style={{ whiteSpace: 'pre-wrap' }}>{s.notes}</Text>
        </Paper>
      )}
      <ArchiveSheetModal sheet={s} opened={archiving} onClose={() => setArchiving(false)} />
    </Stack>
  );
}
