import { SimpleGrid, Stack } from '@mantine/core';
import { EmptyState } from '../../../components/EmptyState';
import { PageHeader } from '../../../components/PageHeader';
import { QueryError } from '../../../components/QueryError';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { useDashboard } from '../api/getDashboard';
import { cardLink } from '../cardLinks';
import { ChartCard } from '../components/ChartCard';
import { StatCard, StatCardSkeleton } from '../components/StatCard';


function firstName(name: string): string {
  return name.trim().split(/\s+/)[0] ?? name;
}

export function Component() {
  const user = useSessionUserOrThrow();
  const dashboard = useDashboard();

  return (
    <>
      <PageHeader title={`Good to see you, ${firstName(user.name)}`} description={user.operationName} />
      {dashboard.isError ? (
        <QueryError error={dashboard.error} onRetry={() => void dashboard.refetch()} />
      ) : dashboard.isPending ? (
        <SimpleGrid cols={{ base: 1, xs: 2, lg: 4 }} spacing="md">
          {[0, 1, 2, 3].map((i) => (
            <StatCardSkeleton key={i} />
          ))}
        </SimpleGrid>
      ) : dashboard.data.cards.length === 0 ? (
        <EmptyState title="Nothing to show yet">
          Figures appear here as soon as there is work, machines or invoices for your role to see.
        </EmptyState>
      ) : (
        <Stack gap="lg">
          <SimpleGrid cols={{ base: 1, xs: 2, lg: 4 }} spacing="md" data-testid="dashboard-cards">
            {dashboard.data.cards.map((card) => (
              <StatCard key={card.key} card={card} link={cardLink(card.key, user.role)} />
            ))}
          </SimpleGrid>
          {dashboard.data.charts.length > 0 && (
            <SimpleGrid cols={{ base: 1, md: 2 }} spacing="md" data-testid="dashboard-charts">
              {dashboard.data.charts.map((chart) => (
                <ChartCard key={chart.key} chart={chart} />
              ))}
            </SimpleGrid>
          )}
        </Stack>
      )}
    </>
  );
}
