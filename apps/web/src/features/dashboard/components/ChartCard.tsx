import { lazy, Suspense } from 'react';
import { Card, Skeleton, Stack, Text } from '@mantine/core';
import type { DashboardChart } from '../api/getDashboard';
import { hasValues } from '../chartPoints';

const DashboardChartView = lazy(() => import('./DashboardChart'));

export function ChartCard({ chart }: { chart: DashboardChart }) {
  return (
    <Card withBorder padding="lg" data-testid={`chart-${chart.key}`}>
      <Stack gap="xs">
        <Text size="sm" c="dimmed" fw={700} tt="uppercase" style={{ letterSpacing: '0.04em' }}>
          {chart.label}
        </Text>
        {hasValues(chart) ? (
          <Suspense fallback={<Skeleton h={220} />}>
            <DashboardChartView chart={chart} />
          </Suspense>
        ) : (
          <Text c="slate.7" py="lg">
            Nothing to plot yet.
          </Text>
        )}
        {chart.hint && (
          <Text size="sm" c="slate.7">
            {chart.hint}
          </Text>
        )}
      </Stack>
    </Card>
  );
}
