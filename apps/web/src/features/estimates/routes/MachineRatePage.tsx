import { useRef, useState } from 'react';
import {
  Button,
  Card,
  Grid,
  Group,
  SegmentedControl,
  SimpleGrid,
  Stack,
  Text,
  Title,
} from '@mantine/core';
import { useMutation } from '@tanstack/react-query';
import { formatMoney } from '@hitchbook/shared/money';
import { fieldCapacityRequestSchema, machineCostRequestSchema } from '@hitchbook/shared/schemas/estimates';
import type { MachineClassResponse } from '@hitchbook/shared/estimates';
import { z } from 'zod';
import { DecimalInput } from '../../../components/DecimalInput';
import { EmptyState } from '../../../components/EmptyState';
import { EstimateNotice } from '../../../components/EstimateNotice';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { PageHeader } from '../../../components/PageHeader';
import { QueryError } from '../../../components/QueryError';
import { useServerForm } from '../../../lib/form';
import { formatDecimal, formatRate, perAcre } from '../../../lib/money';
import { estimateFieldCapacity, type FieldCapacity } from '../api/estimateFieldCapacity';
import { estimateMachineCost, type MachineCostEstimate } from '../api/estimateMachineCost';
import { useMachineClasses } from '../api/getMachineClasses';
import { CostBreakdownChart } from '../components/CostBreakdownChart';
import { CostBreakdownTable } from '../components/CostBreakdownTable';
import { MachineClassSelect } from '../components/MachineClassSelect';
import { MethodNote } from '../components/MethodNote';
import {
  EMPTY_MACHINE_RATE,
  machineRateIssuePath,
  showsEngineFields,
  toMachineRatePayload,
  type MachineRatePayload,
} from '../machineRateForm';


const machineRateSchema = z.object({ cost: machineCostRequestSchema, pass: fieldCapacityRequestSchema.optional() });

interface MachineRateResult {
  estimate: MachineCostEstimate;
  capacity: FieldCapacity | null;
}

async function estimateMachineRate(payload: MachineRatePayload): Promise<MachineRateResult> {
  const [estimate, capacity] = await Promise.all([
    estimateMachineCost(payload.cost),
    payload.pass ? estimateFieldCapacity(payload.pass) : Promise.resolve(null),
  ]);
  return { estimate, capacity };
}

function Section({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <Stack gap="sm">
      <Title order={2} size="h4" c="harbor.9">
        {title}
      </Title>
      {children}
    </Stack>
  );
}

function ResultSummary({ result }: { result: MachineRateResult }) {
  const { estimate, capacity } = result;
  const totalPerAcre = capacity ? perAcre(estimate.perHour.total, capacity.acresPerHour) : null;
  return (
    <SimpleGrid cols={{ base: 1, xs: 2 }} spacing="sm">
      <Card withBorder bg="harbor.9" c="white" padding="md">
        <Text size="sm" fw={700} tt="uppercase" c="harbor.1">
          Total per machine hour
        </Text>
        <Text fz={38} fw={700} lh={1.1} data-testid="total-per-hour">
          {formatMoney(estimate.perHour.total)}
        </Text>
        <Text size="sm" c="harbor.1">
          Ownership {formatMoney(estimate.perHour.ownership)} + operating {formatMoney(estimate.perHour.operating)}
        </Text>
      </Card>
      <Card withBorder padding="md">
        {totalPerAcre && capacity ? (
          <>
            <Text size="sm" fw={700} tt="uppercase" c="dimmed">
              Per acre
            </Text>
            <Text fz={38} fw={700} lh={1.1} c="clay.8" data-testid="total-per-acre">
              {formatMoney(totalPerAcre)}
            </Text>
            <Text size="sm" c="dimmed">
              at {formatDecimal(capacity.acresPerHour, 2)} acres an hour ({formatDecimal(capacity.hectaresPerHour, 2)}{' '}
              ha/h)
            </Text>
          </>
        ) : (
          <>
            <Text size="sm" fw={700} tt="uppercase" c="dimmed">
              Per year
            </Text>
            <Text fz={38} fw={700} lh={1.1} c="clay.8">
              {formatMoney(estimate.perYear.total)}
            </Text>
            <Text size="sm" c="dimmed">
              Add width, speed and efficiency for a per-acre figure.
            </Text>
          </>
        )}
      </Card>
      <Text size="sm" c="slate.8" style={{ gridColumn: '1 / -1' }}>
        Remaining value at trade {formatDecimal(estimate.remainingValuePct, 2)} % of list ={' '}
        {formatMoney(estimate.salvageValue)} · capital recovery factor {estimate.capitalRecoveryFactor}
        {Number(estimate.fuelGallonsPerHour) > 0 && ` · fuel ${formatDecimal(estimate.fuelGallonsPerHour, 2)} gal/h`}
      </Text>
    </SimpleGrid>
  );
}

export function Component() {
  const classes = useMachineClasses();
  const resultRef = useRef<HTMLDivElement>(null);
  const [result, setResult] = useState<MachineRateResult | null>(null);
  const [machineClass, setMachineClass] = useState<MachineClassResponse | undefined>(undefined);
  const engine = showsEngineFields(machineClass);

  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: machineRateSchema,
    initialValues: EMPTY_MACHINE_RATE,
    toPayload: (values) => toMachineRatePayload(values, machineClass),
    mutation: useMutation({ mutationFn: estimateMachineRate }),
    issuePath: machineRateIssuePath,
    onSuccess: (next) => {
      setResult(next);
      // On a phone the result is below the long form; bring it into view.
      requestAnimationFrame(() => resultRef.current?.scrollIntoView({ behavior: 'smooth', block: 'start' }));
    },
  });
  const input = form.getInputProps;

  return (
    <>
      <PageHeader
        title="Machine-hour rate"
        description="What a machine costs to own and run, per year, per hour and per acre, by the published method."
      />
      <Stack gap="md" mb="lg">
        <EstimateNotice />
        <MethodNote />
      </Stack>
      <Grid gutter="lg">
        <Grid.Col span={{ base: 12, md: 5 }}>
          <Card withBorder padding="lg">
            <form onSubmit={onSubmit} noValidate>
              <Stack gap="lg">
                <FormErrorAlert message={formError} />
                {classes.isError && <QueryError error={classes.error} onRetry={() => void classes.refetch()} />}
                <Section title="Machine">
                  <MachineClassSelect
                    classes={classes.data}
                    loading={classes.isPending}
                    value={form.values.machineClass}
                    error={form.errors.machineClass}
                    onChange={(picked) => {
                      setMachineClass(picked ?? undefined);
                      form.setFieldValue('machineClass', picked?.id ?? '');
                      const typical = picked?.fieldOperation;
                      if (typical) {
                        form.setFieldValue('speedMph', form.values.speedMph || typical.speedMph.typical);
                        form.setFieldValue('efficiencyPct', form.values.efficiencyPct || typical.efficiencyPct.typical);
                      }
                    }}
                  />
                  <SimpleGrid cols={2} spacing="sm" style={{ alignItems: 'end' }}>
                    <DecimalInput label="List price" prefix="$" description="New, today" {...input('listPrice')} />
                    <DecimalInput label="Purchase price" prefix="$" description="What you paid" {...input('purchasePrice')} />
                  </SimpleGrid>
                  <SimpleGrid cols={2} spacing="sm" style={{ alignItems: 'end' }}>
                    <DecimalInput label="Years owned" unit="yr" inputMode="numeric" {...input('yearsOwned')} />
                    <DecimalInput label="Use per year" unit="h/yr" inputMode="numeric" {...input('hoursPerYear')} />
                    <DecimalInput label="Age when bought" unit="yr" inputMode="numeric" {...input('ageAtPurchase')} />
                    <DecimalInput label="Meter when bought" unit="h" inputMode="numeric" {...input('hoursAtPurchase')} />
                  </SimpleGrid>
                </Section>

                <Section title="Ownership">
                  <SimpleGrid cols={2} spacing="sm" style={{ alignItems: 'end' }}>
                    <DecimalInput label="Interest rate" unit="%" {...input('interestRatePct')} />
                    <DecimalInput
                      label="Taxes, insurance, housing"
                      unit="%"
                      description="Of average value"
                      {...input('tihPct')}
                    />
                  </SimpleGrid>
                  <DecimalInput
                    label="Trade-in value (optional)"
                    prefix="$"
                    description="Leave blank to use the published remaining-value curve."
                    {...input('salvageValue')}
                  />
                  <SegmentedControl
                    fullWidth
                    data={[
                      { value: 'capital-recovery', label: 'Capital recovery' },
                      { value: 'straight-line', label: 'Straight line' },
                    ]}
                    {...input('method')}
                  />
                </Section>

                <Section title="Running costs">
                  {engine ? (
                    <>
                      <SimpleGrid cols={2} spacing="sm" style={{ alignItems: 'end' }}>
                        <DecimalInput label="PTO horsepower" unit="hp" inputMode="numeric" {...input('ptoHp')} />
                        <DecimalInput label="Fuel price" prefix="$" unit="/gal" {...input('fuelPricePerGallon')} />
                      </SimpleGrid>
                      <SegmentedControl
                        fullWidth
                        aria-label="Fuel"
                        data={[
                          { value: 'diesel', label: 'Diesel' },
                          { value: 'gasoline', label: 'Gasoline' },
                          { value: 'lpg', label: 'LPG' },
                        ]}
                        {...input('fuelType')}
                      />
                      <DecimalInput label="Lubrication" unit="% of fuel" {...input('lubePct')} />
                    </>
                  ) : (
                    <Text size="sm" c="dimmed">
                      An implement burns no fuel of its own; the tractor pulling it carries that cost.
                    </Text>
                  )}
                  <SimpleGrid cols={2} spacing="sm" style={{ alignItems: 'end' }}>
                    <DecimalInput label="Operator wage" prefix="$" unit="/h" {...input('laborWagePerHour')} />
                    <DecimalInput
                      label="Labour factor"
                      unit="×"
                      description="Operator hours per machine hour"
                      {...input('laborFactor')}
                    />
                  </SimpleGrid>
                </Section>

                <Section title="Work rate (optional, for per-acre cost)">
                  <SimpleGrid cols={3} spacing="sm">
                    <DecimalInput label="Width" unit="ft" {...input('widthFt')} />
                    <DecimalInput label="Speed" unit="mph" {...input('speedMph')} />
                    <DecimalInput label="Efficiency" unit="%" {...input('efficiencyPct')} />
                  </SimpleGrid>
                </Section>

                <Group>
                  <Button type="submit" size="lg" loading={submitting} fullWidth>
                    Work out the rate
                  </Button>
                </Group>
              </Stack>
            </form>
          </Card>
        </Grid.Col>
        <Grid.Col span={{ base: 12, md: 7 }}>
          <div ref={resultRef} style={{ scrollMarginTop: 80 }}>
            {result ? (
              <Stack gap="md" data-testid="machine-rate-result">
                <ResultSummary result={result} />
                <Card withBorder padding="md">
                  <CostBreakdownTable estimate={result.estimate} acresPerHour={result.capacity?.acresPerHour ?? null} />
                </Card>
                <Card withBorder padding="md">
                  <Title order={2} size="h4" mb="sm">
                    Per hour: owning against running
                  </Title>
                  <CostBreakdownChart estimate={result.estimate} />
                </Card>
                <Text size="sm" c="dimmed">
                  {formatRate(result.estimate.perHour.total, 'h')} is what this machine costs you, not what to charge a
                  neighbour: custom rates add a margin and cover travel, management and risk.
                </Text>
              </Stack>
            ) : (
              <Card withBorder padding="lg">
                <EmptyState title="No estimate yet">
                  Fill in the machine and press “Work out the rate”. The breakdown and a chart of owning against
                  running costs appear here.
                </EmptyState>
              </Card>
            )}
          </div>
        </Grid.Col>
      </Grid>
    </>
  );
}
