import { useState } from 'react';
import { LineChart } from '@mantine/charts';
import { Button, Card, Grid, Stack, Text, Title } from '@mantine/core';
import { formatMoney } from '@hitchbook/shared/money';
import { breakEvenRequestSchema } from '@hitchbook/shared/schemas/estimates';
import { DecimalInput } from '../../../components/DecimalInput';
import { EmptyState } from '../../../components/EmptyState';
import { EstimateNotice } from '../../../components/EstimateNotice';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { PageHeader } from '../../../components/PageHeader';
import { useServerForm } from '../../../lib/form';
import { formatDecimal } from '../../../lib/money';
import { useEstimateBreakEven } from '../api/estimateBreakEven';
import { ownOrHireCurve, type OwnOrHireInputs } from '../ownOrHireCurve';

interface BreakEvenResult {
  inputs: OwnOrHireInputs;
  breakEvenAcres: string;
}

function trimmed(values: OwnOrHireInputs): OwnOrHireInputs {
  return {
    annualFixedCost: values.annualFixedCost.trim(),
    customRatePerAcre: values.customRatePerAcre.trim(),
    variableCostPerAcre: values.variableCostPerAcre.trim(),
  };
}

function BreakEvenChart({ result }: { result: BreakEvenResult }) {
  const data = ownOrHireCurve(result.inputs, result.breakEvenAcres);
  const breakEven = Number(result.breakEvenAcres);
  return (
    <LineChart
      h={320}
      data={data}
      dataKey="acres"
      series={[
        { name: 'own', label: 'Owning, $ per acre', color: 'harbor.7' },
        { name: 'hire', label: 'Hiring, $ per acre', color: 'clay.6' },
      ]}
      curveType="monotone"
      withLegend
      legendProps={{ verticalAlign: 'bottom', height: 40 }}
      valueFormatter={(value) => formatMoney(value)}
      xAxisProps={{ type: 'number', domain: ['dataMin', 'dataMax'], tickFormatter: (v: number) => formatDecimal(v, 0) }}
      xAxisLabel="Acres a year"
      yAxisLabel="$ per acre"
      referenceLines={breakEven > 0 ? [{ x: breakEven, label: 'Break-even', color: 'slate.6' }] : []}
      data-testid="own-or-hire-chart"
    />
  );
}

export function Component() {
  const [result, setResult] = useState<BreakEvenResult | null>(null);
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: breakEvenRequestSchema,
    initialValues: { annualFixedCost: '', customRatePerAcre: '', variableCostPerAcre: '' },
    toPayload: trimmed,
    mutation: useEstimateBreakEven(),
    onSuccess: (answer, values) => setResult({ inputs: trimmed(values), breakEvenAcres: answer.breakEvenAcres }),
  });

  return (
    <>
      <PageHeader
        title="Own or hire"
        description="How many acres a year a machine must cover before owning it costs less than hiring the job done."
      />
      <Stack gap="md" mb="lg">
        <EstimateNotice />
        <Text size="sm" c="slate.8">
          Break-even acres = annual fixed cost ÷ (custom rate per acre − your own variable cost per acre), the
          break-even-use method of extension farm-management guides (for example Colorado State Extension fact sheet
          3.759). Take the fixed cost from the machine-hour rate (ownership cost per year) and the custom rate from a
          recent custom-rate survey for your area.
        </Text>
      </Stack>
      <Grid gutter="lg">
        <Grid.Col span={{ base: 12, md: 4 }}>
          <Card withBorder padding="lg">
            <form onSubmit={onSubmit} noValidate>
              <Stack gap="md">
                <FormErrorAlert message={formError} />
                <DecimalInput
                  label="Annual fixed cost"
                  prefix="$"
                  unit="/yr"
                  description="Depreciation, interest, taxes, insurance, housing"
                  {...form.getInputProps('annualFixedCost')}
                />
                <DecimalInput
                  label="Custom rate"
                  prefix="$"
                  unit="/acre"
                  description="What hiring the job costs"
                  {...form.getInputProps('customRatePerAcre')}
                />
                <DecimalInput
                  label="Your variable cost"
                  prefix="$"
                  unit="/acre"
                  description="Fuel, lubrication, repairs, labour"
                  {...form.getInputProps('variableCostPerAcre')}
                />
                <Button type="submit" size="lg" loading={submitting} fullWidth>
                  Find the break-even
                </Button>
              </Stack>
            </form>
          </Card>
        </Grid.Col>
        <Grid.Col span={{ base: 12, md: 8 }}>
          {result ? (
            <Stack gap="md" data-testid="break-even-result">
              <Card withBorder padding="lg" bg="harbor.9" c="white">
                <Text size="sm" fw={700} tt="uppercase" c="harbor.1">
                  Break-even
                </Text>
                <Text fz={38} fw={700} lh={1.1} data-testid="break-even-acres">
                  {formatDecimal(result.breakEvenAcres, 2)} acres a year
                </Text>
                <Text c="harbor.1">
                  Below that, hiring at {formatMoney(result.inputs.customRatePerAcre)} an acre is cheaper; above it,
                  owning is.
                </Text>
              </Card>
              <Card withBorder padding="md">
                <Title order={2} size="h4" mb="sm">
                  Cost per acre, owning against hiring
                </Title>
                <BreakEvenChart result={result} />
              </Card>
              <Text size="sm" c="dimmed">
                The comparison leaves out timeliness: a machine of your own can go when the field is ready, which can
                be worth more than the cost difference.
              </Text>
            </Stack>
          ) : (
            <Card withBorder padding="lg">
              <EmptyState title="No break-even yet">
                Enter the three figures to see the acres where owning starts to pay, and a chart of both costs.
              </EmptyState>
            </Card>
          )}
        </Grid.Col>
      </Grid>
    </>
  );
}
