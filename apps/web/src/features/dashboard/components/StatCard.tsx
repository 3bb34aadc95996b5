import { Card, Skeleton, Stack, Text } from '@mantine/core';
import type { DashboardCard } from '../api/getDashboard';

export function StatCard({ card }: { card: DashboardCard }) {
  return (
    <Card withBorder padding="lg" data-testid={`stat-${card.key}`}>
      <Stack gap={4}>
        <Text size="sm" c="dimmed" fw={700} tt="uppercase" style={{ letterSpacing: '0.04em' }}>
          {card.label}
        </Text>
        <Text fz={34} fw={700} c="harbor.9" lh={1.15}>
          {card.value}
        </Text>
        {card.hint && (
          <Text size="sm" c="slate.7">
            {card.hint}
          </Text>
        )}
      </Stack>
    </Card>
  );
}

export function StatCardSkeleton() {
  return (
    <Card withBorder padding="lg">
      <Stack gap="sm">
        <Skeleton h={14} w="60%" />
        <Skeleton h={34} w="40%" />
        <Skeleton h={12} w="80%" />
      </Stack>
    </Card>
  );
}
