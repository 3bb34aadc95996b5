import { lazy, Suspense, useState, type ReactNode } from 'react';
import { Accordion, Button, List, Paper, Select, SimpleGrid, Skeleton, Stack, Text, Title } from '@mantine/core';
import { IconTags } from '@tabler/icons-react';
import { useSearchParams } from 'react-router-dom';
import type { MachineRateRowDto } from '@hitchbook/shared/schemas/reports';
import { EmptyState } from '../../../components/EmptyState';
import { PageHeader } from '../../../components/PageHeader';
import { QueryError } from '../../../components/QueryError';
import { accessTo } from '../../../lib/areas';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { DownloadButtons } from '../../square-ups/components/DownloadButtons';
import { downloadReport } from '../api/downloadReport';
import { useCustomIncome } from '../api/getCustomIncome';
import { useMachineHours } from '../api/getMachineHours';
import { useMachineRates } from '../api/getMachineRates';
import { AcceptRatesModal } from '../components/AcceptRatesModal';
import { CustomIncomeSection } from '../components/CustomIncomeSection';
import { FieldCostTable } from '../components/FieldCostTable';
import { FleetTable } from '../components/FleetTable';
import { MachineDetailModal } from '../components/MachineDetailModal';
import { YearEndNotice } from '../components/YearEndNotice';
import { acceptableMachines, yearFromParam, yearOptions } from '../yearEnd';

const CostPerHourChart = lazy(() => import('../components/CostPerHourChart'));
const HoursChart = lazy(() => import('../components/HoursChart'));

const thisYear = () => new Date().getFullYear();


function ChartPanel({ title, hint, children }: { title: string; hint: string; children: ReactNode }) {
  // Clipped, so a chart's hidden tooltip layer never widens the page on a phone.
  return (
    <Paper withBorder radius="md" p="md" style={{ overflow: 'hidden' }}>
      <Title order={2} size="h4">
        {title}
      </Title>
      <Text size="sm" c="dimmed" mb="sm">
        {hint}
      </Text>
      <Suspense fallback={<Skeleton h={280} />}>{children}</Suspense>
    </Paper>
  );
}

function Fleet({ year, canAccept }: { year: number; canAccept: boolean }) {
  const report = useMachineRates(year);
  const history = useMachineHours();
  const [open, setOpen] = useState<MachineRateRowDto | null>(null);
  const [accepting, setAccepting] = useState(false);
  if (report.isError) return <QueryError error={report.error} onRetry={() => void report.refetch()} />;
  if (report.isPending) return <Skeleton h={420} />;
  const { machines, charts, rules } = report.data;
  if (machines.length === 0) return <EmptyState title={`No machines to report for ${year}`}>Add machines and log their costs and work to see their rates.</EmptyState>;
  return (
    <Stack gap="lg">
      <Paper withBorder radius="md" p="md">
        <Stack gap="sm">
          <Title order={2} size="h4">
            Fleet, {year}
          </Title>
          <Text size="sm" c="dimmed">
            Actual and estimate per machine hour; rates suggested for {year + 1} add a {report.data.marginPct} % margin to the
            higher of the two. Pick a machine to see its costs and the estimate’s inputs.
          </Text>
          <FleetTable rows={machines} onOpen={setOpen} />
          {canAccept && acceptableMachines(machines).length > 0 && (
            <Button
              leftSection={<IconTags size={18} />}
              onClick={() => setAccepting(true)}
              // The label wraps on a phone instead of pushing the page sideways.
              styles={{ root: { alignSelf: 'flex-start', height: 'auto', minHeight: 44, paddingBlock: 8 }, label: { whiteSpace: 'normal' } }}
            >
              Accept suggested rates into a new family rate sheet
            </Button>
          )}
        </Stack>
      </Paper>
      <SimpleGrid cols={{ base: 1, lg: 2 }} spacing="lg">
        <ChartPanel title="Cost per hour by category" hint={`Logged costs of ${year} per machine hour.`}>
          <CostPerHourChart points={charts.costPerHourByCategory} />
        </ChartPanel>
        <ChartPanel title="Hours per year" hint="Machine hours from approved work entries, by year.">
          {history.isError ? <QueryError error={history.error} onRetry={() => void history.refetch()} /> : history.isPending ? <Skeleton h={280} /> : <HoursChart history={history.data} />}
        </ChartPanel>
      </SimpleGrid>
      <Accordion variant="contained">
        <Accordion.Item value="rules">
          <Accordion.Control>How these figures are worked out</Accordion.Control>
          <Accordion.Panel>
            <List size="sm" spacing={4}>
              {rules.map((rule) => (
                <List.Item key={rule}>{rule}</List.Item>
              ))}
            </List>
          </Accordion.Panel>
        </Accordion.Item>
      </Accordion>
      <MachineDetailModal row={open} year={year} onClose={() => setOpen(null)} />
      {canAccept && <AcceptRatesModal rows={machines} year={year} opened={accepting} onClose={() => setAccepting(false)} />}
    </Stack>
  );
}

function IncomeAndFields({ year }: { year: number }) {
  const income = useCustomIncome(year);
  if (income.isError) return <QueryError error={income.error} onRetry={() => void income.refetch()} />;
  if (income.isPending) return <Skeleton h={300} />;
  return (
    <>
      <CustomIncomeSection report={income.data} />
      <FieldCostTable report={income.data} />
    </>
  );
}

export function Component() {
  const user = useSessionUserOrThrow();
  const [search, setSearch] = useSearchParams();
  const now = thisYear();
  const year = yearFromParam(search.get('year'), now);
  const history = useMachineHours();
  const years = yearOptions(history.data?.years ?? [], now);
  return (
    <>
      <PageHeader
        title="Year-end machine rates"
        description="What each machine really cost per hour, against the published-method estimate, and next year’s rates."
        actions={
          <>
            <Select
              aria-label="Year"
              data={years.map(String)}
              value={String(year)}
              onChange={(value) => value && setSearch({ year: value }, { replace: true })}
              allowDeselect={false}
              w={110}
            />
            <DownloadButtons
              files={[
                { label: 'Rates CSV', download: () => downloadReport('machine-rates.csv', year) },
                { label: 'Rates PDF', download: () => downloadReport('machine-rates.pdf', year) },
                { label: 'Income CSV', download: () => downloadReport('custom-income.csv', year) },
              ]}
            />
          </>
        }
      />
      <Stack gap="lg">
        <YearEndNotice />
        <Fleet year={year} canAccept={accessTo(user.role, 'yearEnd') === 'manage'} />
        <IncomeAndFields year={year} />
      </Stack>
    </>
  );
}
