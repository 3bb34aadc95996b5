import { Anchor, Card, Skeleton, Stack, Text } from '@mantine/core';
import { Link } from 'react-router-dom';
import type { DashboardCard } from '../api/getDashboard';

export function StatCard({ card, link }: { card: DashboardCard; link: { href: string; label: string } | null }) {
  return (
    <Card withBorder padding="lg" data-testid={`stat-${card.key}`}>
      <Stack gap={4} h="100%">
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
        {link && (
          <Anchor component={Link} to={link.href} fw={700} mt="auto" pt="xs">
            {link.label} →
          </Anchor>
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
