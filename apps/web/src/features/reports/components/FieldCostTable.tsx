import { Paper, Table, Text, Title } from '@mantine/core';
import { Decimal } from 'decimal.js';
import { formatMoney } from '@hitchbook/shared/money';
import type { CustomIncomeReportDto } from '@hitchbook/shared/schemas/reports';
import { formatDecimal } from '../../../lib/money';

/** Machine cost spread over the fields by hours worked on each, per acre of field. */
export function FieldCostTable({ report }: { report: CustomIncomeReportDto }) {
  const worked = report.fields.filter((f) => !new Decimal(f.hours).isZero());
  return (
    <Paper withBorder radius="md" p="md" data-testid="field-costs">
      <Title order={2} size="h4" mb="sm">
        Machine cost per acre by field
      </Title>
      {worked.length === 0 ? (
        <Text c="dimmed">No machine hours were logged on a field in {report.year}.</Text>
      ) : (
        <Table.ScrollContainer minWidth={600}>
          <Table verticalSpacing={6} striped>
            <Table.Thead>
              <Table.Tr>
                <Table.Th>Field</Table.Th>
                <Table.Th ta="right">Acres</Table.Th>
                <Table.Th ta="right">Machine hours</Table.Th>
                <Table.Th ta="right">Acres worked</Table.Th>
                <Table.Th ta="right">Machine cost</Table.Th>
                <Table.Th ta="right">Per acre</Table.Th>
              </Table.Tr>
            </Table.Thead>
            <Table.Tbody>
              {worked.map((f) => (
                <Table.Tr key={f.fieldId}>
                  <Table.Td>
                    {f.name}
                    {f.kind === 'roadside' && (
                      <Text span size="xs" c="dimmed">
                        {' '}
                        roadside
                      </Text>
                    )}
                  </Table.Td>
                  <Table.Td ta="right">{formatDecimal(f.acres, 1)}</Table.Td>
                  <Table.Td ta="right">{formatDecimal(f.hours, 1)}</Table.Td>
                  <Table.Td ta="right">{formatDecimal(f.acresWorked, 1)}</Table.Td>
                  <Table.Td ta="right">{formatMoney(f.machineCost)}</Table.Td>
                  <Table.Td ta="right" fw={700}>
                    {f.costPerAcre === null ? '—' : formatMoney(f.costPerAcre)}
                  </Table.Td>
                </Table.Tr>
              ))}
            </Table.Tbody>
          </Table>
        </Table.ScrollContainer>
      )}
      {!new Decimal(report.unallocatedMachineCost).isZero() && (
        <Text size="sm" c="dimmed" mt="xs">
          {formatMoney(report.unallocatedMachineCost)} of machine cost belongs to machines that logged no hours on a field.
        </Text>
      )}
    </Paper>
  );
}
