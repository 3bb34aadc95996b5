import { Alert, List, Stack, Text } from '@mantine/core';
import { IconAlertTriangle } from '@tabler/icons-react';
import { CAUTIONS, type CautionKey } from '@hitchbook/shared/cautions';

/** The usual precautions of the work picked, each ending with what comes before them. */
export function CautionAlerts({ keys }: { keys: readonly CautionKey[] }) {
  if (keys.length === 0) return null;
  return (
    <Stack gap="sm" data-testid="cautions">
      {keys.map((key) => {
        const caution = CAUTIONS[key];
        return (
          <Alert
            key={key}
            color="clay"
            variant="light"
            icon={<IconAlertTriangle size={28} />}
            title={caution.title}
            styles={{ title: { fontSize: 'var(--mantine-font-size-lg)' }, root: { borderLeft: '6px solid var(--mantine-color-clay-6)' } }}
            data-testid={`caution-${key}`}
          >
            {/* Markers hang outside the text so a wrapped point stays inside the alert on a phone. */}
            <List spacing={4} size="md" styles={{ root: { listStylePosition: 'outside', paddingInlineStart: 20 } }}>
              {caution.points.map((point) => (
                <List.Item key={point}>{point}</List.Item>
              ))}
            </List>
            <Text fw={700} mt="sm">
              {caution.defersTo}
            </Text>
          </Alert>
        );
      })}
    </Stack>
  );
}
